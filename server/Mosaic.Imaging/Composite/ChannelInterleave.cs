using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;
using Mosaic.Imaging.Display.Colors;

namespace Mosaic.Imaging.Composite;

/// <summary>Three channel level rows into one PNG row (RGB or RGBA), a pixel masked where any band's value is NaN.</summary>
internal static class ChannelInterleave
{
    // Output byte k of the 48 holds channel k % 3 of pixel k / 3; each word's index for a channel is that pixel, or 0x80.
    private static readonly Vector128<byte> RedFirst = Indices(0, 0), GreenFirst = Indices(0, 1), BlueFirst = Indices(0, 2);
    private static readonly Vector128<byte> RedSecond = Indices(16, 0), GreenSecond = Indices(16, 1), BlueSecond = Indices(16, 2);
    private static readonly Vector128<byte> RedThird = Indices(32, 0), GreenThird = Indices(32, 1), BlueThird = Indices(32, 2);

    private static Vector128<byte> Indices(int start, int channel)
    {
        Span<byte> indices = stackalloc byte[16];
        for (var k = 0; k < 16; k++) indices[k] = (start + k) % 3 == channel ? (byte)((start + k) / 3) : (byte)0x80;
        return Vector128.Create((ReadOnlySpan<byte>)indices);
    }

    /// <summary>RGB, nothing masked.</summary>
    public static void Rgb(ReadOnlySpan<byte> red, ReadOnlySpan<byte> green, ReadOnlySpan<byte> blue, Span<byte> rgb)
    {
        var n = red.Length;
        Check(n, green.Length, blue.Length, rgb.Length, 3);
        ref var r = ref MemoryMarshal.GetReference(red);
        ref var g = ref MemoryMarshal.GetReference(green);
        ref var b = ref MemoryMarshal.GetReference(blue);
        ref var o = ref MemoryMarshal.GetReference(rgb);
        var i = 0;
        if (Ssse3.IsSupported)
        {
            // 16 pixels a step: each of the three 16-byte output words gathers its bytes from the three channel
            // words by byte shuffles (an index with the top bit set gives 0) and ORs them together.
            for (; i <= n - 16; i += 16)
            {
                var vr = Vector128.LoadUnsafe(ref r, (nuint)i);
                var vg = Vector128.LoadUnsafe(ref g, (nuint)i);
                var vb = Vector128.LoadUnsafe(ref b, (nuint)i);
                ref var p = ref Unsafe.Add(ref o, 3 * i);
                (Ssse3.Shuffle(vr, RedFirst) | Ssse3.Shuffle(vg, GreenFirst) | Ssse3.Shuffle(vb, BlueFirst)).StoreUnsafe(ref p);
                (Ssse3.Shuffle(vr, RedSecond) | Ssse3.Shuffle(vg, GreenSecond) | Ssse3.Shuffle(vb, BlueSecond)).StoreUnsafe(ref p, 16);
                (Ssse3.Shuffle(vr, RedThird) | Ssse3.Shuffle(vg, GreenThird) | Ssse3.Shuffle(vb, BlueThird)).StoreUnsafe(ref p, 32);
            }
        }
        for (; i < n; i++)
        {
            ref var p = ref Unsafe.Add(ref o, 3 * i);
            p = Unsafe.Add(ref r, i);
            Unsafe.Add(ref p, 1) = Unsafe.Add(ref g, i);
            Unsafe.Add(ref p, 2) = Unsafe.Add(ref b, i);
        }
    }

    /// <summary>RGB with masked pixels in one opaque colour.</summary>
    public static void Rgb(ReadOnlySpan<byte> red, ReadOnlySpan<byte> green, ReadOnlySpan<byte> blue,
        ReadOnlySpan<float> redValues, ReadOnlySpan<float> greenValues, ReadOnlySpan<float> blueValues, Span<byte> rgb, Rgb maskedColor)
    {
        Rgb(red, green, blue, rgb);
        var n = red.Length;
        Check(n, redValues.Length, greenValues.Length, blueValues.Length, 1);
        for (var i = 0; i < n; i++)
        {
            if (!(float.IsNaN(redValues[i]) || float.IsNaN(greenValues[i]) || float.IsNaN(blueValues[i]))) continue;
            rgb[3 * i] = maskedColor.R;
            rgb[3 * i + 1] = maskedColor.G;
            rgb[3 * i + 2] = maskedColor.B;
        }
    }

    /// <summary>RGBA: alpha 255, or 0 (with black) where masked.</summary>
    public static void Rgba(ReadOnlySpan<byte> red, ReadOnlySpan<byte> green, ReadOnlySpan<byte> blue,
        ReadOnlySpan<float> redValues, ReadOnlySpan<float> greenValues, ReadOnlySpan<float> blueValues, Span<byte> rgba)
    {
        var n = red.Length;
        Check(n, green.Length, blue.Length, rgba.Length, 4);
        Check(n, redValues.Length, greenValues.Length, blueValues.Length, 1);
        ref var r = ref MemoryMarshal.GetReference(red);
        ref var g = ref MemoryMarshal.GetReference(green);
        ref var b = ref MemoryMarshal.GetReference(blue);
        ref var vr = ref MemoryMarshal.GetReference(redValues);
        ref var vg = ref MemoryMarshal.GetReference(greenValues);
        ref var vb = ref MemoryMarshal.GetReference(blueValues);
        // Pixels written as little-endian uints: r lowest byte, alpha highest.
        ref var pixel = ref Unsafe.As<byte, uint>(ref MemoryMarshal.GetReference(rgba));
        var i = 0;
        if (Vector128.IsHardwareAccelerated && BitConverter.IsLittleEndian)
        {
            for (; i <= n - 16; i += 16)
            {
                var (r0, r1) = Vector128.Widen(Vector128.LoadUnsafe(ref r, (nuint)i));
                var (g0, g1) = Vector128.Widen(Vector128.LoadUnsafe(ref g, (nuint)i));
                var (b0, b1) = Vector128.Widen(Vector128.LoadUnsafe(ref b, (nuint)i));
                Store(r0, g0, b0, ref vr, ref vg, ref vb, ref pixel, i);
                Store(r1, g1, b1, ref vr, ref vg, ref vb, ref pixel, i + 8);
            }
        }
        for (; i < n; i++)
        {
            var masked = float.IsNaN(Unsafe.Add(ref vr, i)) || float.IsNaN(Unsafe.Add(ref vg, i)) || float.IsNaN(Unsafe.Add(ref vb, i));
            rgba[4 * i] = masked ? (byte)0 : red[i];
            rgba[4 * i + 1] = masked ? (byte)0 : green[i];
            rgba[4 * i + 2] = masked ? (byte)0 : blue[i];
            rgba[4 * i + 3] = masked ? (byte)0 : (byte)255;
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void Store(Vector128<ushort> red, Vector128<ushort> green, Vector128<ushort> blue,
        ref float vr, ref float vg, ref float vb, ref uint pixel, int at)
    {
        var opaque = Vector128.Create(0xFF000000u);
        var (rl, rh) = Vector128.Widen(red);
        var (gl, gh) = Vector128.Widen(green);
        var (bl, bh) = Vector128.Widen(blue);
        ((rl | (gl << 8) | (bl << 16) | opaque) & Valid(ref vr, ref vg, ref vb, at)).StoreUnsafe(ref pixel, (nuint)at);
        ((rh | (gh << 8) | (bh << 16) | opaque) & Valid(ref vr, ref vg, ref vb, at + 4)).StoreUnsafe(ref pixel, (nuint)(at + 4));
    }

    // All ones where no band is NaN, zero where any is.
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector128<uint> Valid(ref float r, ref float g, ref float b, int i)
    {
        var vr = Vector128.LoadUnsafe(ref r, (nuint)i);
        var vg = Vector128.LoadUnsafe(ref g, (nuint)i);
        var vb = Vector128.LoadUnsafe(ref b, (nuint)i);
        return (Vector128.Equals(vr, vr) & Vector128.Equals(vg, vg) & Vector128.Equals(vb, vb)).AsUInt32();
    }

    private static void Check(int n, int a, int b, int output, int bytesPerPixel)
    {
        if (a != n || b != n) throw new ArgumentException($"the three channel rows differ in length ({n}, {a}, {b})");
        if (output < (long)bytesPerPixel * n) throw new ArgumentException($"the output row must hold {bytesPerPixel} bytes a pixel");
    }
}
