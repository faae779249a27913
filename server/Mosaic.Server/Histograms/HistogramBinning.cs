using Mosaic.Imaging.Statistics;

namespace Mosaic.Server.Histograms;

/// <summary>
/// Re-bins a band's fine histogram (bins 2^-11 of the value wide) into a few equal bins. A fine bin cut by an edge
/// is split in proportion to the part of its value range on each side, as if its pixels were spread evenly over it,
/// so each count is exact except for the pixels of the fine bins holding an edge.
/// </summary>
public static class HistogramBinning
{
    public const int MaxBins = 4096;

    public static BinnedHistogram Bin(ValueHistogram histogram, double lo, double hi, int bins, BinScale scale)
    {
        ArgumentNullException.ThrowIfNull(histogram);
        if (bins < 1 || bins > MaxBins) throw new ArgumentOutOfRangeException(nameof(bins), bins, $"bins must be from 1 to {MaxBins}");
        if (!double.IsFinite(lo) || !double.IsFinite(hi)) throw new ArgumentOutOfRangeException(nameof(lo), "lo and hi must be finite");
        if (!(lo < hi)) throw new ArgumentException($"lo ({lo}) must be < hi ({hi})", nameof(hi));
        if (scale == BinScale.Log && !(lo > 0)) throw new ArgumentOutOfRangeException(nameof(lo), lo, "a log-spaced histogram needs lo > 0");

        var edges = new double[bins + 1];
        for (var i = 0; i <= bins; i++)
        {
            var share = (double)i / bins;
            edges[i] = scale == BinScale.Log ? lo * Math.Pow(hi / lo, share) : lo + share * (hi - lo);
        }
        edges[0] = lo;
        edges[bins] = hi;

        // Rounded running totals, differenced: the counts always add up to the pixels between lo and hi.
        var total = histogram.FiniteCount;
        var counts = new long[bins];
        var before = AtOrBelow(histogram, lo, total);
        var running = before;
        for (var i = 0; i < bins; i++)
        {
            var next = AtOrBelow(histogram, edges[i + 1], total);
            counts[i] = next - running;
            running = next;
        }
        return new BinnedHistogram(lo, hi, scale, edges, counts, before, total - running, histogram.MaskedCount);
    }

    private static long AtOrBelow(ValueHistogram histogram, double value, long total) =>
        total == 0 ? 0 : (long)Math.Round(histogram.CumulativeFraction(value) * total, MidpointRounding.AwayFromZero);
}
