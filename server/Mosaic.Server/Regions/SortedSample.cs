using System.Numerics;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Server.Regions;

/// <summary>
/// Exact order statistics of finite values: sorted once, percentiles by the linear rule on rank p (n - 1) (the
/// default of numpy's percentile), MAD by merging the two sorted halves around the median (no second sort).
/// </summary>
internal static class SortedSample
{
    /// <summary>Sorts <paramref name="finite"/> in place (it must hold no NaN) and returns its statistics.</summary>
    public static PixelStatistics Describe(Span<float> finite, long masked, bool exact, int? level)
    {
        var n = finite.Length;
        var percentiles = new double[ReportedPercentiles.Values.Count];
        if (n == 0)
        {
            Array.Fill(percentiles, double.NaN);
            return new PixelStatistics(0, masked, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN, percentiles, exact, level);
        }
        var mean = Sum(finite) / n;
        finite.Sort();
        for (var i = 0; i < percentiles.Length; i++) percentiles[i] = Percentile(finite, ReportedPercentiles.Values[i]);
        var median = Percentile(finite, 50);
        var mad = MedianAbsoluteDeviation(finite, median);
        return new PixelStatistics(n, masked, finite[0], finite[^1], mean, median, BandStatistics.MadToSigma * mad, percentiles, exact, level);
    }

    public static double Percentile(ReadOnlySpan<float> sorted, double percent)
    {
        var rank = percent / 100 * (sorted.Length - 1);
        var below = (int)Math.Floor(rank);
        if (below >= sorted.Length - 1) return sorted[^1];
        var share = rank - below;
        double a = sorted[below], b = sorted[below + 1];
        return a + share * (b - a);
    }

    /// <summary>The median of |v - median|: deviations fall going left from the median and rise going right, so a merge walk finds the middle ones.</summary>
    private static double MedianAbsoluteDeviation(ReadOnlySpan<float> sorted, double median)
    {
        var n = sorted.Length;
        var right = 0;
        while (right < n && sorted[right] < median) right++;
        var left = right - 1;
        int lowRank = (n - 1) / 2, highRank = n / 2;
        double low = 0, high = 0;
        for (var k = 0; k <= highRank; k++)
        {
            double next;
            if (left >= 0 && (right >= n || median - sorted[left] <= sorted[right] - median)) next = median - sorted[left--];
            else next = sorted[right++] - median;
            if (k == lowRank) low = next;
            if (k == highRank) high = next;
        }
        return 0.5 * (low + high);
    }

    private static double Sum(ReadOnlySpan<float> values)
    {
        var low = Vector<double>.Zero;
        var high = Vector<double>.Zero;
        var i = 0;
        for (; i <= values.Length - Vector<float>.Count; i += Vector<float>.Count)
        {
            Vector.Widen(new Vector<float>(values[i..]), out var a, out var b);
            low += a;
            high += b;
        }
        var sum = Vector.Sum(low) + Vector.Sum(high);
        for (; i < values.Length; i++) sum += values[i];
        return sum;
    }
}
