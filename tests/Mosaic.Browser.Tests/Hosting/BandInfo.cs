using System.Text.Json;

namespace Mosaic.Browser.Tests.Hosting;

public sealed record BandInfo(string Name, string File, IReadOnlyList<HduInfo> Hdus)
{
    public HduInfo Hdu(int index) => Hdus.Single(h => h.Index == index);

    public static BandInfo Parse(JsonElement band) => new(
        band.GetProperty("name").GetString()!,
        band.GetProperty("file").GetString()!,
        [.. band.GetProperty("hdus").EnumerateArray().Select(HduInfo.Parse)]);
}
