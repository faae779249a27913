using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Tests.Statistics;

/// <summary>Histogram behaviour that needs no reference data: IEEE 754 facts, edge cases and bad input.</summary>
public sealed class HistogramTests
{
    [Fact]
    public void Min_and_max_follow_ieee_order_across_signs_zeros_and_subnormals()
    {
        // IEEE 754 ordering (common practice): -3.5 < -1e-40 (subnormal) < -0 = +0 < 1e-40 < 2 < 1e30.
        var h = new ValueHistogram();
        h.Add([2f, -0f, 1e-40f, 1e30f, -1e-40f, 0f, -3.5f]);
        Assert.Equal(7, h.FiniteCount);
        Assert.Equal(-3.5, h.Min);
        Assert.Equal(1e30f, (float)h.Max);
        Assert.Equal(-3.5, h.Quantile(0));
        Assert.Equal(1e30f, (float)h.Quantile(1));
        // Sorted: -3.5, -1e-40, -0, 0, 1e-40, 2, 1e30; rank 3 of 0..6 is a zero, and its bin is only subnormals wide.
        Assert.InRange(h.Quantile(0.5), -1e-38, 1e-38);
    }

    [Fact]
    public void Nan_and_infinities_count_as_masked_and_stay_out_of_the_values()
    {
        var values = new float[1000];
        for (var i = 0; i < values.Length; i++) values[i] = i;
        values[10] = float.NaN;
        values[500] = float.PositiveInfinity;
        values[999] = float.NegativeInfinity;
        values[7] = BitConverter.UInt32BitsToSingle(0xFFC0_0001); // a negative NaN with a payload
        var h = new ValueHistogram();
        h.Add(values);
        Assert.Equal(4, h.MaskedCount);
        Assert.Equal(996, h.FiniteCount);
        Assert.Equal(0, h.Min);
        Assert.Equal(998, h.Max);
        // Exact sum of 0..998 less 7, 10 and 500 (arithmetic series).
        Assert.Equal(998.0 * 999 / 2 - 7 - 10 - 500, h.Sum);
    }

    [Fact]
    public void A_constant_field_has_that_value_for_every_quantile_and_zero_spread()
    {
        var values = Enumerable.Repeat(123.456f, 10_001).ToArray();
        var statistics = BandStatistics.From(Add(values));
        Assert.Equal(123.456f, (float)statistics.Median);
        Assert.Equal(123.456f, (float)statistics.Percentile(3));
        Assert.Equal(0, statistics.MadSigma);
        Assert.Equal(123.456f, (float)statistics.Mean, 4);
    }

    [Fact]
    public void An_empty_or_fully_masked_histogram_answers_nan()
    {
        var h = Add([float.NaN, float.NaN]);
        Assert.Equal(0, h.FiniteCount);
        Assert.Equal(2, h.MaskedCount);
        Assert.True(double.IsNaN(h.Quantile(0.5)));
        Assert.True(double.IsNaN(h.CumulativeFraction(1)));
        var statistics = BandStatistics.From(h);
        Assert.True(double.IsNaN(statistics.Median) && double.IsNaN(statistics.MadSigma) && double.IsNaN(statistics.Min) && double.IsNaN(statistics.Mean));
        Assert.Equal(2, statistics.Masked);
    }

    [Fact]
    public void Bad_arguments_get_typed_errors()
    {
        var h = Add([1f, 2f, 3f]);
        Assert.Throws<ArgumentOutOfRangeException>(() => h.Quantile(-0.01));
        Assert.Throws<ArgumentOutOfRangeException>(() => h.Quantile(1.5));
        Assert.Throws<ArgumentOutOfRangeException>(() => h.Quantile(double.NaN));
        Assert.Throws<ArgumentOutOfRangeException>(() => h.CumulativeFraction(double.NaN));
        var statistics = BandStatistics.From(h);
        Assert.Throws<ArgumentOutOfRangeException>(() => statistics.Percentile(101));
        var handMade = new BandStatistics(3, 0, 1, 3, 2, 2, 1);
        Assert.Throws<InvalidOperationException>(() => handMade.Percentile(50));
    }

    [Fact]
    public void Load_rejects_foreign_truncated_and_inconsistent_data()
    {
        Assert.Throws<InvalidDataException>(() => ValueHistogram.Load(new MemoryStream("not a histogram at all"u8.ToArray())));
        var saved = Saved(Add([1f, 2f, 3f, 1000f]));
        Assert.Throws<InvalidDataException>(() => ValueHistogram.Load(new MemoryStream(saved[..^5])));
        var tampered = (byte[])saved.Clone();
        tampered[12] ^= 1; // the finite count no longer matches the bins
        Assert.Throws<InvalidDataException>(() => ValueHistogram.Load(new MemoryStream(tampered)));
        var otherVersion = (byte[])saved.Clone();
        otherVersion[4] = 99;
        Assert.Throws<InvalidDataException>(() => ValueHistogram.Load(new MemoryStream(otherVersion)));
    }

    [Fact]
    public void Cumulative_fraction_is_zero_below_the_minimum_one_at_the_maximum_and_monotone()
    {
        var values = new float[4096];
        for (var i = 0; i < values.Length; i++) values[i] = MathF.Exp(i / 300f) - 5;
        var h = Add(values);
        Assert.Equal(0, h.CumulativeFraction(h.Min - 1));
        Assert.Equal(1, h.CumulativeFraction(h.Max));
        var previous = 0.0;
        for (var v = h.Min; v < h.Max; v += (h.Max - h.Min) / 5000)
        {
            var f = h.CumulativeFraction(v);
            Assert.True(f >= previous, $"fraction fell from {previous} to {f} at {v}");
            previous = f;
        }
    }

    private static ValueHistogram Add(float[] values)
    {
        var h = new ValueHistogram();
        h.Add(values);
        return h;
    }

    private static byte[] Saved(ValueHistogram h)
    {
        using var stream = new MemoryStream();
        h.Save(stream);
        return stream.ToArray();
    }
}
