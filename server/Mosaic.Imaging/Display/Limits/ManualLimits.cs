using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Display.Limits;

/// <summary>Fixed physical limits chosen by the viewer.</summary>
public sealed record ManualLimits : IValueLimits
{
    public ManualLimits(double lo, double hi)
    {
        if (!double.IsFinite(lo) || Math.Abs(lo) > float.MaxValue)
            throw new ArgumentOutOfRangeException(nameof(lo), lo, "lo must be finite (within float32 range)");
        if (!double.IsFinite(hi) || Math.Abs(hi) > float.MaxValue)
            throw new ArgumentOutOfRangeException(nameof(hi), hi, "hi must be finite (within float32 range)");
        if (!(lo < hi)) throw new ArgumentException($"lo ({lo}) must be < hi ({hi})", nameof(hi));
        if (!FieldLimits.IsUsable(lo, hi))
            throw new ArgumentException($"hi - lo must be at least {FieldLimits.RelativeFloor} of |lo| and |hi| (float32 resolution)", nameof(hi));
        Lo = lo;
        Hi = hi;
    }

    public double Lo { get; }
    public double Hi { get; }

    public string CanonicalKey => $"manual({KeyText.Number(Lo)},{KeyText.Number(Hi)})";

    public ValueRange Resolve(BandStatistics statistics, ValueHistogram histogram) => new(Lo, Hi);
}
