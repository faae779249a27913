using System.Text.Json;

namespace Mosaic.Browser.Tests.Hosting;

public sealed record HduInfo(int Index, string Name, int Width, int Height, int MaxZoom, string PyramidState)
{
    public static HduInfo Parse(JsonElement hdu) => new(
        hdu.GetProperty("index").GetInt32(),
        hdu.GetProperty("name").GetString()!,
        hdu.GetProperty("width").GetInt32(),
        hdu.GetProperty("height").GetInt32(),
        hdu.GetProperty("maxZoom").GetInt32(),
        hdu.GetProperty("pyramid").GetProperty("state").GetString()!);
}
