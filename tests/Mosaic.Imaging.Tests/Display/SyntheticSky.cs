using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Tests.Display;

/// <summary>
/// A made-up sky for tests: Gaussian noise on a flat background, point sources with Gaussian profiles (flux
/// spread over decades), some saturated, and optionally a few NaN holes. Seeded, so every run sees the same field.
/// </summary>
internal static class SyntheticSky
{
    public static float[] Make(int width, int height, int seed, double background = 60, double noise = 12, int sources = 40, double saturation = 65535, bool holes = false)
    {
        var rng = new Random(seed);
        var data = new double[width * height];
        for (var i = 0; i < data.Length; i++) data[i] = background + noise * Gaussian(rng);
        for (var s = 0; s < sources; s++)
        {
            double cx = rng.NextDouble() * width, cy = rng.NextDouble() * height;
            var peak = noise * Math.Pow(10, 0.3 + 3.7 * rng.NextDouble());
            var sigma = 1.2 + 1.5 * rng.NextDouble();
            var reach = (int)Math.Ceiling(5 * sigma * Math.Max(1, Math.Log10(peak / noise)));
            for (var y = Math.Max(0, (int)cy - reach); y < Math.Min(height, (int)cy + reach); y++)
                for (var x = Math.Max(0, (int)cx - reach); x < Math.Min(width, (int)cx + reach); x++)
                {
                    var r2 = (x + 0.5 - cx) * (x + 0.5 - cx) + (y + 0.5 - cy) * (y + 0.5 - cy);
                    data[y * width + x] += peak * Math.Exp(-r2 / (2 * sigma * sigma));
                }
        }
        var result = new float[data.Length];
        for (var i = 0; i < data.Length; i++) result[i] = (float)Math.Min(saturation, data[i]);
        if (holes)
            for (var h = 0; h < 5; h++)
            {
                int hx = rng.Next(width - 10), hy = rng.Next(height - 10);
                for (var y = hy; y < hy + 10; y++) for (var x = hx; x < hx + 10; x++) result[y * width + x] = float.NaN;
            }
        return result;
    }

    public static (BandStatistics Statistics, ValueHistogram Histogram) Statistics(ReadOnlySpan<float> values)
    {
        var histogram = new ValueHistogram();
        histogram.Add(values);
        return (BandStatistics.From(histogram), histogram);
    }

    private static double Gaussian(Random rng) => Math.Sqrt(-2 * Math.Log(1 - rng.NextDouble())) * Math.Cos(2 * Math.PI * rng.NextDouble());
}
