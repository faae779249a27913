using Mosaic.Imaging.Tests.Display;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Imaging.Tests.Composite;

/// <summary>Three synthetic bands of one made-up scene, and PNGs decoded by ImageSharp into RGBA bytes.</summary>
internal static class CompositeImages
{
    /// <summary>
    /// Red, green and blue bands of one sky (sources at the same places, colours varied by band), with a few sources
    /// far past any range (saturated), some negative sky, and NaN holes in <paramref name="holesIn"/> (-1 for none).
    /// </summary>
    public static float[][] Bands(int width, int height, int holesIn = -1)
    {
        var bands = new float[3][];
        for (var c = 0; c < 3; c++) bands[c] = SyntheticSky.Make(width, height, seed: 11, background: 20 + 10 * c, noise: 6, sources: 30, holes: c == holesIn);
        // The same sources in every band (one seed); tilt the colours so channels differ.
        var rng = new Random(5);
        for (var i = 0; i < bands[0].Length; i++)
        {
            bands[0][i] *= 1.6f;
            bands[2][i] *= 0.7f;
        }
        // Saturated, coloured blobs: intensities thousands of times the range, fixed channel ratios 1 : 0.5 : 0.2 and 0.1 : 0.3 : 1.
        for (var s = 0; s < 2; s++)
        {
            int cx = 20 + rng.Next(width - 40), cy = 20 + rng.Next(height - 40);
            var ratio = s == 0 ? new[] { 1f, 0.5f, 0.2f } : new[] { 0.1f, 0.3f, 1f };
            for (var y = cy - 3; y <= cy + 3; y++)
                for (var x = cx - 3; x <= cx + 3; x++)
                    for (var c = 0; c < 3; c++)
                        bands[c][y * width + x] = 4e5f * ratio[c] + (20 + 10 * c) * (c == 0 ? 1.6f : c == 2 ? 0.7f : 1f);
        }
        return bands;
    }

    public static byte[] Rgba(byte[] png, out int width, out int height)
    {
        using var image = Image.Load<Rgba32>(png);
        width = image.Width;
        height = image.Height;
        var bytes = new byte[4 * width * height];
        image.CopyPixelDataTo(bytes);
        return bytes;
    }
}
