using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;

namespace Mosaic.Imaging.Rendering;

/// <summary>Interleaves levels with an alpha of 0 where the value is NaN (masked or outside), 255 elsewhere.</summary>
internal static class GrayAlpha
{
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void Interleave(ReadOnlySpan<byte> levels, ReadOnlySpan<float> values, Span<byte> grayAlpha)
    {
        if (levels.Length != values.Length) throw new ArgumentException("levels and values must be the same length", nameof(levels));
        if (grayAlpha.Length < 2 * values.Length) throw new ArgumentException("grayAlpha must hold two bytes a pixel", nameof(grayAlpha));
        ref var value = ref MemoryMarshal.GetReference(values);
        ref var level = ref MemoryMarshal.GetReference(levels);
        // Pairs are written as little-endian ushorts (gray low, alpha high).
        ref var pair = ref Unsafe.As<byte, ushort>(ref MemoryMarshal.GetReference(grayAlpha));
        var n = values.Length;
        var i = 0;
        if (Vector128.IsHardwareAccelerated && BitConverter.IsLittleEndian)
        {
            for (; i <= n - 16; i += 16)
            {
                var alpha = Vector128.Narrow(
                    Vector128.Narrow(Mask(ref value, i), Mask(ref value, i + 4)),
                    Vector128.Narrow(Mask(ref value, i + 8), Mask(ref value, i + 12))).AsByte();
                var gray = Vector128.LoadUnsafe(ref level, (nuint)i);
                var (grayLow, grayHigh) = Vector128.Widen(gray);
                var (alphaLow, alphaHigh) = Vector128.Widen(alpha);
                (grayLow | (alphaLow << 8)).StoreUnsafe(ref pair, (nuint)i);
                (grayHigh | (alphaHigh << 8)).StoreUnsafe(ref pair, (nuint)(i + 8));
            }
        }
        for (; i < n; i++)
        {
            grayAlpha[2 * i] = levels[i];
            grayAlpha[2 * i + 1] = float.IsNaN(values[i]) ? (byte)0 : (byte)255;
        }
    }

    // -1 (all ones) for a finite or infinite value, 0 for NaN.
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector128<int> Mask(ref float value, int i)
    {
        var v = Vector128.LoadUnsafe(ref value, (nuint)i);
        return Vector128.Equals(v, v).AsInt32();
    }
}
