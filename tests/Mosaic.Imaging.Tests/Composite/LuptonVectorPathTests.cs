using Mosaic.Imaging.Composite;

namespace Mosaic.Imaging.Tests.Composite;

/// <summary>
/// The Lupton map's vector loop (its own log, reciprocal-square-root and reciprocal estimates) against its one-pixel
/// path (MathF.Log, MathF.Sqrt, IEEE division), which the astropy comparison in <see cref="LuptonReferenceTests"/>
/// exercises on every row's tail: here on the values the synthetic scenes never reach.
/// </summary>
public sealed class LuptonVectorPathTests
{
    [Theory]
    [InlineData(8, 60)]
    [InlineData(0.5, 400)]
    [InlineData(1e4, 0.01)]
    public void The_vector_loop_agrees_with_the_one_pixel_path_within_1_DN_on_extreme_values(double q, double range)
    {
        var bands = CompositeImages.Bands(64, 64);
        var map = new LuptonSettings(q, range, new Channels<double>(0, 0, 0)).Compile(LuptonReferenceTests.Channels(bands));
        var soften = (float)(q / range);
        // Intensities around the series limit x = 0.125, subnormal and tiny, huge and past float32, negative and mixed.
        var special = new List<(float R, float G, float B)>
        {
            (1e-40f, 1e-40f, 1e-40f), (1e-38f, 0, 0), (3e-39f, -1e-39f, 2e-39f), (1e-30f, 5e-31f, 0),
            (float.PositiveInfinity, 1, 1), (1, float.NegativeInfinity, 1), (float.PositiveInfinity, float.PositiveInfinity, float.PositiveInfinity),
            (1e35f, 1e34f, 1e33f), (1e20f, 1, -1e19f), (float.MaxValue, float.MaxValue, 0), (-5, -7, -1), (100, -99.9f, 0.01f),
            (1e6f, -1e6f + 1e-2f, 0), (65000, 30000, 12),
        };
        foreach (var scale in new[] { 0.9f, 0.99f, 0.999f, 1f, 1.001f, 1.01f, 1.1f, 2f, 10f, 1e3f, 1e6f })
        {
            var i = 3 * 0.125f / soften * scale;
            special.Add((i / 3, i / 3, i / 3));
            special.Add((i, 0, 0));
            special.Add((2 * i, -i, 0));
        }
        var random = new Random(7);
        while (special.Count % 16 != 0 || special.Count < 128)
            special.Add(((float)(random.NextDouble() * 200 - 20), (float)(random.NextDouble() * 200 - 20), (float)(random.NextDouble() * 200 - 20)));

        var n = special.Count;
        var red = special.Select(p => p.R).ToArray();
        var green = special.Select(p => p.G).ToArray();
        var blue = special.Select(p => p.B).ToArray();
        var levels = new byte[3 * n];
        map.Apply(red, green, blue, levels.AsSpan(0, n), levels.AsSpan(n, n), levels.AsSpan(2 * n, n));
        var one = new byte[3];
        var nonZero = 0;
        for (var k = 0; k < n; k++)
        {
            // A run of one pixel is below every vector width, so it takes the one-pixel path.
            map.Apply(red.AsSpan(k, 1), green.AsSpan(k, 1), blue.AsSpan(k, 1), one.AsSpan(0, 1), one.AsSpan(1, 1), one.AsSpan(2, 1));
            for (var c = 0; c < 3; c++)
            {
                Assert.True(Math.Abs(levels[c * n + k] - one[c]) <= 1,
                    $"pixel ({red[k]}, {green[k]}, {blue[k]}) channel {c}: vector {levels[c * n + k]}, one-pixel {one[c]}");
                if (one[c] > 0) nonZero++;
            }
        }
        // The values must exercise the scale, not only the black floor.
        Assert.True(nonZero > n, $"only {nonZero} channel levels above 0");
    }
}
