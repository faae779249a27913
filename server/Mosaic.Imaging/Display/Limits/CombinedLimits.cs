using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Display.Limits;

/// <summary>lo from one rule and hi from another, e.g. a robust floor under the sky with a percentile ceiling over the sources.</summary>
public sealed record CombinedLimits : IValueLimits
{
    public CombinedLimits(IValueLimits lower, IValueLimits upper)
    {
        Lower = lower ?? throw new ArgumentNullException(nameof(lower), "lower must be given");
        Upper = upper ?? throw new ArgumentNullException(nameof(upper), "upper must be given");
    }

    /// <summary>The rule whose lo is used.</summary>
    public IValueLimits Lower { get; }

    /// <summary>The rule whose hi is used.</summary>
    public IValueLimits Upper { get; }

    public string CanonicalKey => $"combined({Lower.CanonicalKey},{Upper.CanonicalKey})";

    public ValueRange Resolve(BandStatistics statistics, ValueHistogram histogram)
        => FieldLimits.Settle(Lower.Resolve(statistics, histogram).Lo, Upper.Resolve(statistics, histogram).Hi, statistics);
}
