using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Display.Limits;

/// <summary>
/// lo = median - sigmasBelow * sigma, hi = median + sigmasAbove * sigma, with sigma the MAD-based sigma, kept inside
/// the field's min..max so no levels go to values that do not occur. Outlier-proof where min/max are not.
/// </summary>
public sealed record RobustLimits : IValueLimits
{
    public RobustLimits(double sigmasBelow, double sigmasAbove)
    {
        if (!double.IsFinite(sigmasBelow)) throw new ArgumentOutOfRangeException(nameof(sigmasBelow), sigmasBelow, "sigmasBelow must be finite");
        if (!double.IsFinite(sigmasAbove)) throw new ArgumentOutOfRangeException(nameof(sigmasAbove), sigmasAbove, "sigmasAbove must be finite");
        if (!(sigmasBelow + sigmasAbove > 0))
            throw new ArgumentException($"sigmasBelow + sigmasAbove must be > 0 (got {sigmasBelow} + {sigmasAbove})", nameof(sigmasAbove));
        SigmasBelow = sigmasBelow;
        SigmasAbove = sigmasAbove;
    }

    public double SigmasBelow { get; }
    public double SigmasAbove { get; }

    public string CanonicalKey => $"robust({KeyText.Number(SigmasBelow)},{KeyText.Number(SigmasAbove)})";

    public ValueRange Resolve(BandStatistics statistics, ValueHistogram histogram)
    {
        ArgumentNullException.ThrowIfNull(statistics);
        var lo = statistics.Median - SigmasBelow * statistics.MadSigma;
        var hi = statistics.Median + SigmasAbove * statistics.MadSigma;
        // Max/Min would pass NaN through from an empty field; Settle repairs that case.
        if (lo < statistics.Min) lo = statistics.Min;
        if (hi > statistics.Max) hi = statistics.Max;
        return FieldLimits.Settle(lo, hi, statistics);
    }
}
