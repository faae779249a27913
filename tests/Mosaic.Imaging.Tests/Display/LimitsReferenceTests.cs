using System.Text.Json;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Tests.Display;

/// <summary>
/// Limit rules against numpy (Debian python3-numpy) on the same float32 field: numpy.nanpercentile for percentile
/// limits, numpy.nanmedian and astropy.stats.mad_std (Debian python3-astropy) for robust limits. Tolerances are the
/// histogram's precision: its relative bin width at the value, plus the gap between the order statistics around
/// the rank (numpy interpolates between them; a histogram only knows the bin).
/// </summary>
public sealed class LimitsReferenceTests
{
    private const string Script = """
        from astropy.stats import mad_std
        v = np.fromfile("values.f32", dtype="<f4").astype(np.float64)
        f = np.sort(v[np.isfinite(v)])
        def gap(p):
            h = p / 100.0 * (f.size - 1)
            k0 = max(int(np.floor(h)) - 1, 0); k1 = min(int(np.ceil(h)) + 1, f.size - 1)
            return float(f[k1] - f[k0])
        pairs = json.load(open("percentiles.json"))
        out = {"percentiles": [[float(np.nanpercentile(v, p)), gap(p)] for p in pairs],
               "median": float(np.nanmedian(v)), "madStd": float(mad_std(v, ignore_nan=True)),
               "medianGap": gap(50.0), "min": float(f[0]), "max": float(f[-1])}
        json.dump(out, open("expected.json", "w"))
        """;

    private static readonly double[] Percents = [0, 0.5, 10, 50, 90, 90.25, 99.5, 99.9, 100];

    private readonly float[] _field;
    private readonly BandStatistics _statistics;
    private readonly ValueHistogram _histogram;
    private readonly JsonElement _expected;

    public LimitsReferenceTests()
    {
        _field = SyntheticSky.Make(600, 500, seed: 23, background: 1200, noise: 35, holes: true);
        (_statistics, _histogram) = SyntheticSky.Statistics(_field);
        using var folder = new TemporaryFolder();
        OutsideReference.WriteFloat32(folder.File("values.f32"), _field);
        File.WriteAllText(folder.File("percentiles.json"), JsonSerializer.Serialize(Percents));
        OutsideReference.Run(Script, folder.Path);
        _expected = JsonDocument.Parse(File.ReadAllText(folder.File("expected.json"))).RootElement.Clone();
    }

    [Theory]
    [InlineData(0, 100)]
    [InlineData(0.5, 99.5)]
    [InlineData(10, 90.25)]
    [InlineData(50, 99.9)]
    public void Percentile_limits_match_numpy_nanpercentile(double lower, double upper)
    {
        var range = new PercentileLimits(lower, upper).Resolve(_statistics, _histogram);
        AssertNear(Percent(lower), range.Lo, $"{lower}th percentile");
        AssertNear(Percent(upper), range.Hi, $"{upper}th percentile");
    }

    [Theory]
    [InlineData(2, 2)]
    [InlineData(1, 5)]
    [InlineData(0.5, 20)]
    public void Robust_limits_match_numpy_median_and_astropy_mad_std(double below, double above)
    {
        var median = _expected.GetProperty("median").GetDouble();
        var sigma = _expected.GetProperty("madStd").GetDouble();
        var range = new RobustLimits(below, above).Resolve(_statistics, _histogram);
        // The median's histogram error plus the sigma's: MAD is found in bins of width W |v| at v = median ± MAD,
        // and our MAD-to-sigma factor 1.4826 is astropy's 1/Φ⁻¹(3/4) = 1.482602... rounded (relative 1.5e-6).
        var w = ValueHistogram.RelativeBinWidth;
        var medianTolerance = w * Math.Abs(median) * 2 + _expected.GetProperty("medianGap").GetDouble();
        var sigmaTolerance = 1.4826 * 2 * (w * (Math.Abs(median) + sigma) + _expected.GetProperty("medianGap").GetDouble()) + 2e-6 * sigma;
        var expectedLo = Math.Max(median - below * sigma, _expected.GetProperty("min").GetDouble());
        var expectedHi = Math.Min(median + above * sigma, _expected.GetProperty("max").GetDouble());
        Assert.InRange(range.Lo, expectedLo - medianTolerance - below * sigmaTolerance, expectedLo + medianTolerance + below * sigmaTolerance);
        Assert.InRange(range.Hi, expectedHi - medianTolerance - above * sigmaTolerance, expectedHi + medianTolerance + above * sigmaTolerance);
    }

    [Theory]
    [InlineData(99.0)]
    [InlineData(80.0)]
    [InlineData(100.0)]
    public void Percentile_limits_with_linear_stretch_match_astropy_PercentileInterval_within_1_DN(double percentile)
    {
        // astropy.visualization.PercentileInterval(p) keeps the central p percent: limits at (100 - p)/2 and
        // 100 - (100 - p)/2, then (with clip) u = (v - lo)/(hi - lo) in [0, 1]; LinearStretch gives t = u.
        using var folder = new TemporaryFolder();
        OutsideReference.WriteFloat32(folder.File("values.f32"), _field);
        File.WriteAllText(folder.File("p.json"), percentile.ToString("R", System.Globalization.CultureInfo.InvariantCulture));
        OutsideReference.Run("""
            from astropy.visualization import PercentileInterval
            v = np.fromfile("values.f32", dtype="<f4").astype(np.float64)
            interval = PercentileInterval(json.load(open("p.json")))
            lo, hi = interval.get_limits(v)
            f = v[np.isfinite(v)]
            np.asarray(LinearStretch()(interval(f, clip=True), clip=True), "<f8").tofile("expected.f64")
            json.dump([float(lo), float(hi)], open("limits.json", "w"))
            """, folder.Path);
        var limits = JsonSerializer.Deserialize<double[]>(File.ReadAllText(folder.File("limits.json")))!;
        var tail = (100 - percentile) / 2;
        var settings = new Mosaic.Imaging.Display.DisplaySettings
        {
            Limits = new PercentileLimits(tail, 100 - tail),
            Stretch = new Mosaic.Imaging.Display.Stretches.LinearStretch(),
        };
        var toneMap = settings.Compile(_statistics, _histogram);
        // The limits themselves as close to astropy's as the histogram allows (see AssertNear).
        AssertNear((limits[0], Percent(tail).Gap), toneMap.Lo, $"astropy's lower limit for PercentileInterval({percentile})");
        AssertNear((limits[1], Percent(100 - tail).Gap), toneMap.Hi, $"astropy's upper limit for PercentileInterval({percentile})");
        var expected = OutsideReference.ReadFloat64(folder.File("expected.f64"));
        var finite = _field.Where(v => !float.IsNaN(v)).ToArray();
        Assert.Equal(finite.Length, expected.Length);
        var levels = new byte[finite.Length];
        toneMap.Apply(finite, levels);
        for (var i = 0; i < finite.Length; i++)
            Assert.True(Math.Abs(levels[i] - 255 * expected[i]) <= 1, $"v = {finite[i]:R}: level {levels[i]}, astropy 255 y = {255 * expected[i]:F3}");
    }

    private (double Value, double Gap) Percent(double p)
    {
        var entry = _expected.GetProperty("percentiles")[Array.IndexOf(Percents, p)];
        return (entry[0].GetDouble(), entry[1].GetDouble());
    }

    private static void AssertNear((double Value, double Gap) expected, double actual, string what)
    {
        var tolerance = 2 * ValueHistogram.RelativeBinWidth * Math.Abs(expected.Value) + expected.Gap;
        Assert.True(Math.Abs(actual - expected.Value) <= tolerance,
            $"{what}: ours {actual:R}, numpy {expected.Value:R}, allowed {tolerance:G3}");
    }
}
