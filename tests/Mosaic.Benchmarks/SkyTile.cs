using System.Globalization;
using System.Runtime.InteropServices;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Rendering;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Benchmarks;

/// <summary>
/// The baseline test tile: 256 x 256 Gaussian sky noise (mean 60, sigma 12) with 30 saturated 8 x 8 spots, and the
/// default display compiled on its own statistics. Exported for baseline/tile_baseline.py, which times numpy and
/// Pillow on the very same values and limits.
/// </summary>
internal static class SkyTile
{
    public const int Side = 256;
    public const float Saturation = 65000f;

    /// <summary>Where the tile (little-endian float32, top row first) and its resolved display are written for the Python baseline.</summary>
    public static string ExportFolder => Path.Combine(Path.GetTempPath(), "mosaic-bench-sky-tile");

    public static float[] Create(bool withMaskedBlock = false)
    {
        var random = new Random(60_12);
        var tile = new float[Side * Side];
        for (var i = 0; i < tile.Length; i++)
        {
            var u1 = 1.0 - random.NextDouble();
            var u2 = random.NextDouble();
            tile[i] = (float)(60 + 12 * Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2));
        }
        for (var spot = 0; spot < 30; spot++)
        {
            int x0 = random.Next(Side - 8), y0 = random.Next(Side - 8);
            for (var y = y0; y < y0 + 8; y++) tile.AsSpan(y * Side + x0, 8).Fill(Saturation);
        }
        // A chip edge: the right 40 columns outside the image, as NaN.
        if (withMaskedBlock)
            for (var y = 0; y < Side; y++) tile.AsSpan(y * Side + Side - 40, 40).Fill(float.NaN);
        return tile;
    }

    /// <summary>The default display on the tile's own statistics, with the resolved limits and softening.</summary>
    public static (ToneMap ToneMap, double Lo, double Hi, double Soft) DefaultDisplay(float[] tile)
    {
        var histogram = new ValueHistogram();
        histogram.Add(tile);
        var statistics = BandStatistics.From(histogram);
        var toneMap = DisplaySettings.Default.Compile(statistics, histogram);
        return (toneMap, toneMap.Lo, toneMap.Hi, DisplaySettings.DefaultSoftSigmas * statistics.MadSigma);
    }

    public static void Export(float[] tile, double lo, double hi, double soft)
    {
        Directory.CreateDirectory(ExportFolder);
        File.WriteAllBytes(Path.Combine(ExportFolder, "tile.f32"), MemoryMarshal.AsBytes(tile.AsSpan()).ToArray());
        File.WriteAllText(Path.Combine(ExportFolder, "display.json"),
            string.Create(CultureInfo.InvariantCulture, $$"""{"lo": {{lo:R}}, "hi": {{hi:R}}, "soft": {{soft:R}}}"""));
    }
}
