using Mosaic.Demo.Randomness;
using Mosaic.Demo.Rendering;

namespace Mosaic.Demo.Tests.Units;

/// <summary>Noise and charge bleeding against the statistics and physics they model.</summary>
public sealed class DetectorTests
{
    [Fact]
    public void Gaussian_noise_has_the_moments_and_one_sigma_fraction_of_a_standard_normal()
    {
        var rng = Xoshiro256StarStar.For(7, RandomStream.PixelNoise, 1, 2);
        var buffer = new float[4096];
        double n = 0, sum = 0, sum2 = 0, sum4 = 0, within = 0;
        for (var k = 0; k < 250; k++)
        {
            GaussianNoise.Fill(rng, buffer);
            foreach (double z in buffer)
            {
                n++; sum += z; sum2 += z * z; sum4 += z * z * z * z;
                if (Math.Abs(z) < 1) within++;
            }
        }
        var mean = sum / n;
        var variance = sum2 / n - mean * mean;
        Assert.InRange(mean, -0.005, 0.005);
        Assert.InRange(variance, 0.99, 1.01);
        // Normal distribution: kurtosis 3, P(|z| < 1) = erf(1/√2) = 0.682689 (standard tables; value from memory).
        Assert.InRange(sum4 / n / (variance * variance), 2.95, 3.05);
        Assert.InRange(within / n, 0.680, 0.6855);
    }

    [Fact]
    public void Separate_streams_do_not_repeat_each_other()
    {
        var a = new float[64];
        var b = new float[64];
        GaussianNoise.Fill(Xoshiro256StarStar.For(7, RandomStream.PixelNoise, 0, 1), a);
        GaussianNoise.Fill(Xoshiro256StarStar.For(7, RandomStream.PixelNoise, 1, 0), b);
        Assert.NotEqual(a, b);
        var c = new float[64];
        GaussianNoise.Fill(Xoshiro256StarStar.For(7, RandomStream.PixelNoise, 0, 1), c);
        Assert.Equal(a, c);
    }

    [Fact]
    public void Bleeding_conserves_charge_and_runs_along_the_column()
    {
        // Charge conservation of blooming (common practice): what leaves a full pixel lands in its column.
        const int width = 9, height = 400;
        const float fullWell = 1000;
        var image = new float[width * height];
        Array.Fill(image, 100f);
        image[200 * width + 4] = 30_100;   // 29 100 e- above full well
        image[201 * width + 4] = 5_100;
        image[200 * width + 5] = 1_050;
        var before = image.Sum(v => (double)v);

        ChargeBleed.Apply(image, width, height, fullWell, [(3, 199, 6, 202)]);

        double after = 0;
        var masked = 0;
        foreach (var v in image)
        {
            if (float.IsNaN(v)) { masked++; after += fullWell; }
            else after += v;
        }
        Assert.Equal(before, after, 1e-3);
        var inColumn = Enumerable.Range(0, height).Count(y => float.IsNaN(image[y * width + 4]));
        // 29 100 + 4 100 e- of excess fill 900 e- of room per pixel: about 37 more pixels, split up and down.
        Assert.InRange(inColumn, 38, 40);
        Assert.Equal(inColumn + 1, masked);
        Assert.True(float.IsNaN(image[200 * width + 5]));
        Assert.False(float.IsNaN(image[200 * width + 3]));
    }

    [Fact]
    public void Noise_maps_electrons_to_ADU_and_masks_at_SATURATE()
    {
        var row = new float[] { 0, 1000, 59_990, float.NaN, 90_000, 500, 500, 500, 500, 500, 500 };
        var zero = new float[row.Length];
        DetectorNoise.Apply(row, zero, 4, 1.5f, 60_000);
        Assert.Equal(0, row[0]);
        Assert.Equal(1000 / 1.5, row[1], 0.001);
        Assert.Equal(59_990 / 1.5, row[2], 0.01);
        Assert.True(float.IsNaN(row[3]));
        Assert.True(float.IsNaN(row[4]));
        Assert.Equal(500 / 1.5, row[^1], 0.001);

        // One sigma up: sqrt(N + RN²) electrons (the CCD noise equation, common practice).
        var one = new float[] { 900, 900, 900, 900, 900, 900, 900, 900, 900 };
        var ones = Enumerable.Repeat(1f, one.Length).ToArray();
        DetectorNoise.Apply(one, ones, 4, 2f, 60_000);
        Assert.All(one, v => Assert.Equal((900 + Math.Sqrt(916)) / 2, v, 0.001));
    }
}
