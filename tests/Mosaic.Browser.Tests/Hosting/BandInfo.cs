using System.Text.Json;

namespace Mosaic.Browser.Tests.Hosting;

/// <summary>A band: its file, its image HDUs and, when the server places its chips on one grid, its whole field.</summary>
public sealed record BandInfo(string Name, string File, IReadOnlyList<HduInfo> Hdus, CanvasInfo? Canvas)
{
    public HduInfo Hdu(int index) => Hdus.Single(h => h.Index == index);

    /// <summary>The whole field, which the demo field's bands (8 chips each) must have.</summary>
    public CanvasInfo WholeField => Canvas ?? throw new InvalidOperationException($"band {Name} has no canvas in the field list");

    public static BandInfo Parse(JsonElement band) => new(
        band.GetProperty("name").GetString()!,
        band.GetProperty("file").GetString()!,
        [.. band.GetProperty("hdus").EnumerateArray().Select(HduInfo.Parse)],
        CanvasInfo.Parse(band));
}
