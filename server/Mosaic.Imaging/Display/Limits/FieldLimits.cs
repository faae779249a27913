using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Display.Limits;

/// <summary>Turns a rule's raw (lo, hi) into a usable range, so a flat, empty or odd field still renders instead of failing.</summary>
public static class FieldLimits
{
    /// <summary>
    /// Narrowest width relative to the values: about 16 float32 steps, below which float32 data cannot be told
    /// apart and the tone map's float index would lose its precision.
    /// </summary>
    public const double RelativeFloor = 1e-6;

    /// <summary>Narrowest absolute width, far above float32's smallest normal value.</summary>
    public const double AbsoluteFloor = 1e-30;

    /// <summary>True where (lo, hi) can be shown: finite within float32, lo &lt; hi and not narrower than the floors.</summary>
    public static bool IsUsable(double lo, double hi)
        => double.IsFinite(lo) && double.IsFinite(hi) && Math.Abs(lo) <= float.MaxValue && Math.Abs(hi) <= float.MaxValue
           && hi - lo >= Math.Max(Math.Max(Math.Abs(lo), Math.Abs(hi)) * RelativeFloor, AbsoluteFloor);

    /// <summary>
    /// (lo, hi) when usable; else the field's min..max; else a narrow range centred on the one value present (so a
    /// flat field shows one even level); else a range around 0 for a field with no finite pixel (all masked anyway).
    /// </summary>
    public static ValueRange Settle(double lo, double hi, BandStatistics statistics)
    {
        ArgumentNullException.ThrowIfNull(statistics);
        if (IsUsable(lo, hi)) return new ValueRange(lo, hi);
        if (IsUsable(statistics.Min, statistics.Max)) return new ValueRange(statistics.Min, statistics.Max);
        var centre = Finite(statistics.Median) ?? Finite(statistics.Min) ?? Finite(lo) ?? Finite(hi) ?? 0;
        var half = Math.Max(Math.Abs(centre) * RelativeFloor, AbsoluteFloor);
        return new ValueRange(centre - half, centre + half);
    }

    private static double? Finite(double v) => double.IsFinite(v) && Math.Abs(v) <= float.MaxValue / 2 ? v : null;
}
