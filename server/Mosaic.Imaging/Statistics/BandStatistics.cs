namespace Mosaic.Imaging.Statistics;

/// <summary>
/// Summary statistics of a band's finite pixels over the whole field, from its histogram. Quantities derived
/// from the histogram (median, MAD sigma, percentiles) are exact to within one bin
/// (<see cref="ValueHistogram.RelativeBinWidth"/> of the value). NaN where no pixel is finite.
/// </summary>
public sealed record BandStatistics(long Count, long Masked, double Min, double Max, double Mean, double Median, double MadSigma)
{
    /// <summary>1 / Φ⁻¹(3/4): makes the median absolute deviation estimate σ for Gaussian noise (common practice).</summary>
    public const double MadToSigma = 1.4826;

    /// <summary>The histogram these came from, for <see cref="Percentile"/>; null for statistics built by hand.</summary>
    public ValueHistogram? Histogram { get; init; }

    public static BandStatistics From(ValueHistogram histogram)
    {
        ArgumentNullException.ThrowIfNull(histogram);
        var median = histogram.Quantile(0.5);
        return new BandStatistics(histogram.FiniteCount, histogram.MaskedCount, histogram.Min, histogram.Max,
            histogram.Mean, median, MadToSigma * MedianAbsoluteDeviation(histogram, median))
        {
            Histogram = histogram,
        };
    }

    /// <summary>The value below which pct percent (0..100) of the finite pixels lie.</summary>
    public double Percentile(double pct)
    {
        if (!(pct >= 0 && pct <= 100)) throw new ArgumentOutOfRangeException(nameof(pct), pct, "a percentile lies between 0 and 100");
        if (Histogram is null) throw new InvalidOperationException("these statistics carry no histogram; build them with BandStatistics.From");
        return Histogram.Quantile(pct / 100);
    }

    /// <summary>The half-width d around the median holding half the pixels: the median of |v - median|, by bisection on the histogram's cumulative fractions.</summary>
    private static double MedianAbsoluteDeviation(ValueHistogram histogram, double median)
    {
        if (histogram.FiniteCount == 0) return double.NaN;
        double low = 0, high = Math.Max(histogram.Max - median, median - histogram.Min);
        if (high == 0) return 0;
        for (var i = 0; i < 200 && high - low > Math.Max(high, 1e-300) * 1e-15; i++)
        {
            var d = 0.5 * (low + high);
            var inside = histogram.CumulativeFraction(median + d) - histogram.CumulativeFraction(median - d);
            if (inside < 0.5) low = d; else high = d;
        }
        return 0.5 * (low + high);
    }
}
