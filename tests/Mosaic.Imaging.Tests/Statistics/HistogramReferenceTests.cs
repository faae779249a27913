using System.Text.Json;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Tests.Statistics;

/// <summary>Histogram and band statistics against numpy (Debian python3-numpy) on the same float32 samples.</summary>
public sealed class HistogramReferenceTests(ReferenceSamples samples) : IClassFixture<ReferenceSamples>
{
    public static TheoryData<string> Names => new(ReferenceSamples.Names);

    [Theory]
    [MemberData(nameof(Names))]
    public void Counts_extremes_and_mean_match_numpy(string name)
    {
        var h = Histogram(samples.Values(name));
        var expected = samples.Expected(name);
        // numpy (Debian python3-numpy): np.isfinite counts, nanmin/nanmax, float64 mean of the finite values.
        Assert.Equal(expected.GetProperty("finite").GetInt64(), h.FiniteCount);
        Assert.Equal(expected.GetProperty("masked").GetInt64(), h.MaskedCount);
        Assert.Equal(expected.GetProperty("min").GetDouble(), h.Min);
        Assert.Equal(expected.GetProperty("max").GetDouble(), h.Max);
        var mean = expected.GetProperty("mean").GetDouble();
        Assert.InRange(h.Mean, mean - 1e-9 * expected.GetProperty("meanScale").GetDouble(), mean + 1e-9 * expected.GetProperty("meanScale").GetDouble());
    }

    [Theory]
    [MemberData(nameof(Names))]
    public void Quantiles_match_numpy_nanpercentile(string name) => AssertQuantiles(Histogram(samples.Values(name)), samples.Expected(name));

    [Theory]
    [MemberData(nameof(Names))]
    public void Median_and_mad_sigma_match_numpy(string name)
    {
        var statistics = BandStatistics.From(Histogram(samples.Values(name)));
        var expected = samples.Expected(name);
        // numpy (Debian python3-numpy): nanmedian, and 1.4826 * median(|v - median|) — the scale astropy.stats.mad_std uses.
        AssertNear(expected.GetProperty("median").GetDouble(), statistics.Median, expected.GetProperty("medianTolerance").GetDouble(), "median");
        AssertNear(expected.GetProperty("madSigma").GetDouble(), statistics.MadSigma, expected.GetProperty("madSigmaTolerance").GetDouble(), "MAD sigma");
        foreach (var q in expected.GetProperty("quantiles").EnumerateArray())
            AssertNear(q.GetProperty("value").GetDouble(), statistics.Percentile(q.GetProperty("p").GetDouble()), q.GetProperty("tolerance").GetDouble(), $"percentile {q.GetProperty("p")}");
    }

    [Theory]
    [MemberData(nameof(Names))]
    public void Cumulative_fraction_matches_numpy(string name)
    {
        var h = Histogram(samples.Values(name));
        // numpy (Debian python3-numpy): share of finite values ≤ v; the bound is the share inside v's bin.
        foreach (var probe in samples.Expected(name).GetProperty("probes").EnumerateArray())
            AssertNear(probe.GetProperty("fraction").GetDouble(), h.CumulativeFraction(probe.GetProperty("value").GetDouble()),
                probe.GetProperty("tolerance").GetDouble(), $"fraction below {probe.GetProperty("value")}");
    }

    [Theory]
    [MemberData(nameof(Names))]
    public void Merged_halves_match_numpy_on_the_whole(string name)
    {
        var values = samples.Values(name);
        var first = Histogram(values.AsSpan(0, values.Length / 3).ToArray());
        first.Merge(Histogram(values.AsSpan(values.Length / 3).ToArray()));
        var expected = samples.Expected(name);
        Assert.Equal(expected.GetProperty("finite").GetInt64(), first.FiniteCount);
        Assert.Equal(expected.GetProperty("masked").GetInt64(), first.MaskedCount);
        Assert.Equal(expected.GetProperty("min").GetDouble(), first.Min);
        Assert.Equal(expected.GetProperty("max").GetDouble(), first.Max);
        AssertQuantiles(first, expected);
    }

    [Theory]
    [MemberData(nameof(Names))]
    public void Saved_and_loaded_histogram_still_matches_numpy(string name)
    {
        var built = Histogram(samples.Values(name));
        using var stream = new MemoryStream();
        built.Save(stream);
        stream.Position = 0;
        var loaded = ValueHistogram.Load(stream);
        var expected = samples.Expected(name);
        Assert.Equal(expected.GetProperty("finite").GetInt64(), loaded.FiniteCount);
        Assert.Equal(expected.GetProperty("masked").GetInt64(), loaded.MaskedCount);
        Assert.Equal(expected.GetProperty("min").GetDouble(), loaded.Min);
        Assert.Equal(expected.GetProperty("max").GetDouble(), loaded.Max);
        AssertQuantiles(loaded, expected);
        // A loaded (compact) histogram merges too: twice the counts, the same quantiles.
        loaded.Merge(built);
        Assert.Equal(2 * expected.GetProperty("finite").GetInt64(), loaded.FiniteCount);
        AssertQuantiles(loaded, expected);
    }

    private static ValueHistogram Histogram(float[] values)
    {
        var h = new ValueHistogram();
        // Uneven pieces, as strips of a frame arrive: the result must not depend on how values are split.
        for (int start = 0, step = 1; start < values.Length; start += step, step = step * 3 + 1)
            h.Add(values.AsSpan(start, Math.Min(step, values.Length - start)));
        return h;
    }

    private static void AssertQuantiles(ValueHistogram h, JsonElement expected)
    {
        // numpy (Debian python3-numpy): nanpercentile, default linear method, with the bin bound from the script.
        foreach (var q in expected.GetProperty("quantiles").EnumerateArray())
        {
            var p = q.GetProperty("p").GetDouble();
            AssertNear(q.GetProperty("value").GetDouble(), h.Quantile(p / 100), q.GetProperty("tolerance").GetDouble(), $"quantile {p}%");
        }
    }

    private static void AssertNear(double expected, double actual, double tolerance, string what)
    {
        Assert.True(Math.Abs(actual - expected) <= tolerance * (1 + 1e-9) + 1e-300,
            $"{what}: expected {expected:R} ± {tolerance:R}, got {actual:R} (off by {Math.Abs(actual - expected):R})");
    }
}
