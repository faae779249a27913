using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Display.Limits;

/// <summary>Limits at two percentiles (0..100) of the field's finite pixels, read from the band histogram.</summary>
public sealed record PercentileLimits : IValueLimits
{
    public PercentileLimits(double lowerPercent, double upperPercent)
    {
        if (!(lowerPercent >= 0 && lowerPercent < 100))
            throw new ArgumentOutOfRangeException(nameof(lowerPercent), lowerPercent, "lowerPercent must be in [0, 100)");
        if (!(upperPercent > 0 && upperPercent <= 100))
            throw new ArgumentOutOfRangeException(nameof(upperPercent), upperPercent, "upperPercent must be in (0, 100]");
        if (!(lowerPercent < upperPercent))
            throw new ArgumentException($"lowerPercent ({lowerPercent}) must be < upperPercent ({upperPercent})", nameof(upperPercent));
        LowerPercent = lowerPercent;
        UpperPercent = upperPercent;
    }

    public double LowerPercent { get; }
    public double UpperPercent { get; }

    public string CanonicalKey => $"percentile({KeyText.Number(LowerPercent)},{KeyText.Number(UpperPercent)})";

    public ValueRange Resolve(BandStatistics statistics, ValueHistogram histogram)
    {
        ArgumentNullException.ThrowIfNull(statistics);
        ArgumentNullException.ThrowIfNull(histogram);
        if (histogram.FiniteCount == 0) return FieldLimits.Settle(double.NaN, double.NaN, statistics);
        return FieldLimits.Settle(histogram.Quantile(LowerPercent / 100), histogram.Quantile(UpperPercent / 100), statistics);
    }
}
