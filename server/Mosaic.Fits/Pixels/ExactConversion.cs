namespace Mosaic.Fits.Pixels;

/// <summary>Integer to float/double with a single rounding, for 64-bit samples plus an integral BZERO.</summary>
internal static class ExactConversion
{
    public static float ToSingle(Int128 value)
    {
        if (value >= long.MinValue && value <= long.MaxValue) return (long)value;
        var negative = value < 0;
        var magnitude = (ulong)(negative ? -value : value);   // |value| < 2^64 for a 64-bit sample plus |BZERO| <= 2^63
        var f = HalfWithSticky(magnitude) * 2f;
        return negative ? -f : f;
    }

    public static double ToDouble(Int128 value)
    {
        if (value >= long.MinValue && value <= long.MaxValue) return (long)value;
        var negative = value < 0;
        var magnitude = (ulong)(negative ? -value : value);
        var d = HalfWithStickyDouble(magnitude) * 2d;
        return negative ? -d : d;
    }

    // Halving keeps the lost low bit as a sticky bit, so the one rounding of the signed conversion stays correct
    // (common practice for unsigned-to-float conversion without a native instruction).
    private static float HalfWithSticky(ulong u) => (long)((u >> 1) | (u & 1));

    private static double HalfWithStickyDouble(ulong u) => (long)((u >> 1) | (u & 1));
}
