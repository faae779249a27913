using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Display.Stretches;

/// <summary>The asinh pivot c: the lower limit, the band's median, or a physical value.</summary>
public sealed record AsinhPivot
{
    private AsinhPivot(AsinhPivotKind kind, double value)
    {
        Kind = kind;
        Value = value;
    }

    public static AsinhPivot AtLo { get; } = new(AsinhPivotKind.Lo, 0);

    public static AsinhPivot AtMedian { get; } = new(AsinhPivotKind.Median, 0);

    /// <summary>A fixed physical pivot; finite within float32 range.</summary>
    public static AsinhPivot At(double value)
    {
        if (!double.IsFinite(value) || Math.Abs(value) > float.MaxValue)
            throw new ArgumentOutOfRangeException("pivot", value, "pivot must be finite (within float32 range)");
        return new AsinhPivot(AsinhPivotKind.Value, value + 0.0);
    }

    public AsinhPivotKind Kind { get; }

    /// <summary>The physical value for <see cref="AsinhPivotKind.Value"/>; 0 otherwise.</summary>
    public double Value { get; }

    public string CanonicalKey => Kind switch
    {
        AsinhPivotKind.Lo => "lo",
        AsinhPivotKind.Median => "median",
        _ => KeyText.Number(Value),
    };

    /// <summary>The physical pivot for a field; the lower limit where the median is unknown.</summary>
    public double Resolve(ValueRange limits, BandStatistics statistics) => Kind switch
    {
        AsinhPivotKind.Median when double.IsFinite(statistics.Median) => statistics.Median,
        AsinhPivotKind.Value => Value,
        _ => limits.Lo,
    };
}
