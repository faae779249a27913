namespace Mosaic.Imaging.Statistics;

/// <summary>
/// The order-preserving uint32 form of a float32 bit pattern: every bit flipped for negative floats, the sign bit
/// set for positive ones, so unsigned comparison of keys orders the floats (-inf &lt; … &lt; -0 &lt; +0 &lt; … &lt; +inf).
/// A histogram bin is the top <see cref="ValueHistogram.KeyBits"/> bits of the key.
/// </summary>
internal static class FloatKey
{
    public const int BinShift = 32 - ValueHistogram.KeyBits;
    public const int BinCount = 1 << ValueHistogram.KeyBits;
    public const uint LowBitsMask = (1u << BinShift) - 1;

    /// <summary>Bins of the most negative and most positive finite floats; bins outside hold only ±inf and NaN.</summary>
    public static readonly uint FirstFiniteBin = FromBits(0xFF7F_FFFFu) >> BinShift;
    public static readonly uint LastFiniteBin = FromBits(0x7F7F_FFFFu) >> BinShift;

    public static uint FromBits(uint bits) => bits ^ ((uint)((int)bits >> 31) | 0x8000_0000u);

    public static uint ToBits(uint key) => (key & 0x8000_0000u) != 0 ? key & 0x7FFF_FFFFu : ~key;

    public static uint FromFloat(float value) => FromBits(BitConverter.SingleToUInt32Bits(value));

    public static float ToFloat(uint key) => BitConverter.UInt32BitsToSingle(ToBits(key));

    public static bool IsFiniteBin(uint bin) => bin >= FirstFiniteBin && bin <= LastFiniteBin;

    /// <summary>Smallest and largest float of a bin (both inclusive).</summary>
    public static (double Low, double High) BinRange(uint bin)
        => (ToFloat(bin << BinShift), ToFloat((bin << BinShift) | LowBitsMask));
}
