using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;
using Mosaic.Imaging.Display;

namespace Mosaic.Imaging.Composite;

/// <summary>
/// The Lupton composite compiled: float32 arithmetic in the order astropy.visualization.make_lupton_rgb uses on
/// float32 images (subtract the minimum, mean intensity, asinh factor, clip negatives, divide by the largest channel
/// where it reaches 255, truncate to 8 bits), so levels agree with it within 1 DN.
/// </summary>
public sealed class LuptonMap : CompositeMap
{
    /// <summary>Channel values past this are saturated whatever the other channels: clamping keeps sums and products finite.</summary>
    private const float ChannelLimit = 1e30f;

    /// <summary>asinh arguments past this saturate (asinh > 40, times a slope of at least 3): clamping keeps x² finite in float32.</summary>
    private const float ArgumentLimit = 1e18f;

    /// <summary>Below this the asinh series to x⁷ is exact to float32 (next term 35x⁹/1152, under 2e-9 relative).</summary>
    private const float SeriesLimit = 0.125f;

    private const float PixMax = 255f;

    private readonly float _minRed, _minGreen, _minBlue;
    private readonly float _scaleRed, _scaleGreen, _scaleBlue;
    private readonly float _soften;
    private readonly float _slope;

    internal LuptonMap(LuptonParameters parameters, MaskedColor masked) : base(masked)
    {
        ArgumentNullException.ThrowIfNull(parameters);
        CheckUsable(parameters.Q, parameters.Range);
        Parameters = parameters;
        (_minRed, _minGreen, _minBlue) = ((float)parameters.Minimum.Red, (float)parameters.Minimum.Green, (float)parameters.Minimum.Blue);
        (_scaleRed, _scaleGreen, _scaleBlue) = ((float)parameters.Scale.Red, (float)parameters.Scale.Green, (float)parameters.Scale.Blue);
        _soften = (float)(parameters.Q / parameters.Range);
        _slope = (float)Slope(parameters.Q);
    }

    public LuptonParameters Parameters { get; }

    /// <summary>astropy's AsinhMapping: 0.1 × 255 / asinh(0.1 Q), so an intensity of range / 10 maps to 25.5 DN before clipping.</summary>
    public static double Slope(double q) => 0.1 * PixMax / Math.Asinh(0.1 * q);

    /// <summary>True where Q / range and its product with the slope are normal, finite float32 numbers.</summary>
    public static bool IsUsable(double q, double range)
    {
        var soften = (float)(q / range);
        return float.IsNormal(soften) && float.IsFinite(soften * (float)Slope(q)) && float.IsNormal(1 / soften);
    }

    internal static void CheckUsable(double q, double range)
    {
        if (!IsUsable(q, range))
            throw new ArgumentOutOfRangeException(nameof(range), range, $"range {range} with q {q} puts q / range outside float32 range: choose a range nearer the data's scale");
    }

    public override CompositeMap WithMasked(MaskedColor masked) => masked == Masked ? this : new LuptonMap(Parameters, masked);

    private protected override void ApplyCore(ReadOnlySpan<float> red, ReadOnlySpan<float> green, ReadOnlySpan<float> blue,
        Span<byte> redLevels, Span<byte> greenLevels, Span<byte> blueLevels)
    {
        var n = red.Length;
        var i = 0;
        ref var r = ref MemoryMarshal.GetReference(red);
        ref var g = ref MemoryMarshal.GetReference(green);
        ref var b = ref MemoryMarshal.GetReference(blue);
        ref var lr = ref MemoryMarshal.GetReference(redLevels);
        ref var lg = ref MemoryMarshal.GetReference(greenLevels);
        ref var lb = ref MemoryMarshal.GetReference(blueLevels);
        if (Avx512F.IsSupported)
        {
            // 32 pixels a step as two interleaved blocks of 16: one block's chain through sqrt, log and division is
            // long enough that the core waits on it; two give it independent work. Each channel is truncated to
            // bytes in one instruction (vpmovdb).
            for (; i <= n - 32; i += 32)
            {
                var (r0, g0, b0, r1, g1, b1) = Pixels512(ref r, ref g, ref b, i);
                Avx512F.ConvertToVector128Byte(r0).StoreUnsafe(ref lr, (nuint)i);
                Avx512F.ConvertToVector128Byte(g0).StoreUnsafe(ref lg, (nuint)i);
                Avx512F.ConvertToVector128Byte(b0).StoreUnsafe(ref lb, (nuint)i);
                Avx512F.ConvertToVector128Byte(r1).StoreUnsafe(ref lr, (nuint)(i + 16));
                Avx512F.ConvertToVector128Byte(g1).StoreUnsafe(ref lg, (nuint)(i + 16));
                Avx512F.ConvertToVector128Byte(b1).StoreUnsafe(ref lb, (nuint)(i + 16));
            }
        }
        else if (Vector.IsHardwareAccelerated)
        {
            var lanes = Vector<float>.Count;
            // Four float vectors narrow to one byte vector.
            for (; i <= n - 4 * lanes; i += 4 * lanes)
            {
                var (r0, g0, b0) = Pixels(ref r, ref g, ref b, i);
                var (r1, g1, b1) = Pixels(ref r, ref g, ref b, i + lanes);
                var (r2, g2, b2) = Pixels(ref r, ref g, ref b, i + 2 * lanes);
                var (r3, g3, b3) = Pixels(ref r, ref g, ref b, i + 3 * lanes);
                Narrow(r0, r1, r2, r3).StoreUnsafe(ref lr, (nuint)i);
                Narrow(g0, g1, g2, g3).StoreUnsafe(ref lg, (nuint)i);
                Narrow(b0, b1, b2, b3).StoreUnsafe(ref lb, (nuint)i);
            }
        }
        for (; i < n; i++)
        {
            var (pr, pg, pb) = Pixel(Unsafe.Add(ref r, i), Unsafe.Add(ref g, i), Unsafe.Add(ref b, i));
            Unsafe.Add(ref lr, i) = pr;
            Unsafe.Add(ref lg, i) = pg;
            Unsafe.Add(ref lb, i) = pb;
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector<byte> Narrow(Vector<int> a, Vector<int> b, Vector<int> c, Vector<int> d) =>
        Vector.Narrow(Vector.Narrow(Vector.AsVectorUInt32(a), Vector.AsVectorUInt32(b)), Vector.Narrow(Vector.AsVectorUInt32(c), Vector.AsVectorUInt32(d)));

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private (Vector<int> Red, Vector<int> Green, Vector<int> Blue) Pixels(ref float red, ref float green, ref float blue, int i)
    {
        var limit = new Vector<float>(ChannelLimit);
        var zero = Vector<float>.Zero;
        var pixMax = new Vector<float>(PixMax);
        var r = Vector.ClampNative((Vector.LoadUnsafe(ref red, (nuint)i) - new Vector<float>(_minRed)) * new Vector<float>(_scaleRed), -limit, limit);
        var g = Vector.ClampNative((Vector.LoadUnsafe(ref green, (nuint)i) - new Vector<float>(_minGreen)) * new Vector<float>(_scaleGreen), -limit, limit);
        var b = Vector.ClampNative((Vector.LoadUnsafe(ref blue, (nuint)i) - new Vector<float>(_minBlue)) * new Vector<float>(_scaleBlue), -limit, limit);
        var intensity = (r + g + b) / new Vector<float>(3f);
        var x = Vector.ClampNative(intensity * new Vector<float>(_soften), zero, new Vector<float>(ArgumentLimit));
        var factor = Vector.ConditionalSelect(Vector.GreaterThan(intensity, zero), Asinh(x) * new Vector<float>(_slope) / intensity, zero);
        r = Vector.ClampNative(r * factor, zero, limit);
        g = Vector.ClampNative(g * factor, zero, limit);
        b = Vector.ClampNative(b * factor, zero, limit);
        // Where the largest channel reaches 255 all three are scaled by 255 / largest (one division, not astropy's
        // three: a rounding apart, far inside the 1 DN bound); elsewhere by 1.
        var largest = Vector.Max(r, Vector.Max(g, b));
        var down = Vector.ConditionalSelect(Vector.GreaterThanOrEqual(largest, pixMax), pixMax / largest, Vector<float>.One);
        r = Vector.MinNative(r * down, pixMax);
        g = Vector.MinNative(g * down, pixMax);
        b = Vector.MinNative(b * down, pixMax);
        // Truncation toward zero, as numpy's astype(uint8) of a value in [0, 255].
        return (Vector.ConvertToInt32Native(r), Vector.ConvertToInt32Native(g), Vector.ConvertToInt32Native(b));
    }

    /// <summary>The same operations as <see cref="Pixels"/> on two blocks of 16 lanes (i and i + 16).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private (Vector512<int>, Vector512<int>, Vector512<int>, Vector512<int>, Vector512<int>, Vector512<int>) Pixels512(
        ref float red, ref float green, ref float blue, int i)
    {
        var (r0, g0, b0, i0) = Scaled512(ref red, ref green, ref blue, i);
        var (r1, g1, b1, i1) = Scaled512(ref red, ref green, ref blue, i + 16);
        var (f0, f1) = Factors512(i0, i1);
        var (pr0, pg0, pb0) = Levels512(r0 * f0, g0 * f0, b0 * f0);
        var (pr1, pg1, pb1) = Levels512(r1 * f1, g1 * f1, b1 * f1);
        return (pr0, pg0, pb0, pr1, pg1, pb1);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private (Vector512<float> Red, Vector512<float> Green, Vector512<float> Blue, Vector512<float> Intensity) Scaled512(
        ref float red, ref float green, ref float blue, int i)
    {
        var limit = Vector512.Create(ChannelLimit);
        var r = Vector512.ClampNative((Vector512.LoadUnsafe(ref red, (nuint)i) - Vector512.Create(_minRed)) * Vector512.Create(_scaleRed), -limit, limit);
        var g = Vector512.ClampNative((Vector512.LoadUnsafe(ref green, (nuint)i) - Vector512.Create(_minGreen)) * Vector512.Create(_scaleGreen), -limit, limit);
        var b = Vector512.ClampNative((Vector512.LoadUnsafe(ref blue, (nuint)i) - Vector512.Create(_minBlue)) * Vector512.Create(_scaleBlue), -limit, limit);
        // Times 1/3 rather than numpy's division by 3: at most one float32 rounding apart.
        return (r, g, b, (r + g + b) * Vector512.Create(1f / 3));
    }

    /// <summary>
    /// asinh(I·soften)·slope / I for two blocks, their operations interleaved; 0 where I ≤ 0. Below the series limit
    /// the factor is slope·soften·asinh(x)/x from the series, no division (and I may be subnormal there); above it
    /// I is at least 0.125 / soften, a normal number, so a reciprocal estimate with one Newton step replaces the divider.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private (Vector512<float>, Vector512<float>) Factors512(Vector512<float> i0, Vector512<float> i1)
    {
        var zero = Vector512<float>.Zero;
        var one = Vector512<float>.One;
        var argumentLimit = Vector512.Create(ArgumentLimit);
        var soften = Vector512.Create(_soften);
        var x0 = Vector512.ClampNative(i0 * soften, zero, argumentLimit);
        var x1 = Vector512.ClampNative(i1 * soften, zero, argumentLimit);
        var sq0 = x0 * x0;
        var sq1 = x1 * x1;
        var (y0, y1) = Sqrt512(sq0 + one, sq1 + one);
        var (log0, log1) = Log512(x0 + y0, x1 + y1);
        var seriesLimit = Vector512.Create(SeriesLimit);
        var slope = Vector512.Create(_slope);
        var slopeSoften = Vector512.Create(_slope * _soften);
        var f0 = Vector512.ConditionalSelect(Vector512.LessThan(x0, seriesLimit), slopeSoften * SeriesRatio512(sq0), log0 * slope * Reciprocal512(i0));
        var f1 = Vector512.ConditionalSelect(Vector512.LessThan(x1, seriesLimit), slopeSoften * SeriesRatio512(sq1), log1 * slope * Reciprocal512(i1));
        return (Vector512.ConditionalSelect(Vector512.GreaterThan(i0, zero), f0, zero), Vector512.ConditionalSelect(Vector512.GreaterThan(i1, zero), f1, zero));
    }

    /// <summary>asinh(x) / x from the series to x⁷ (see <see cref="SeriesLimit"/>), given x².</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector512<float> SeriesRatio512(Vector512<float> x2)
        => Vector512<float>.One + x2 * (Vector512.Create(-1f / 6) + x2 * (Vector512.Create(3f / 40) + x2 * Vector512.Create(-5f / 112)));

    /// <summary>Channels times the factor to levels: clip negatives, scale by 255 / largest where it reaches 255, truncate.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static (Vector512<int> Red, Vector512<int> Green, Vector512<int> Blue) Levels512(Vector512<float> r, Vector512<float> g, Vector512<float> b)
    {
        var zero = Vector512<float>.Zero;
        var limit = Vector512.Create(ChannelLimit);
        var pixMax = Vector512.Create(PixMax);
        r = Vector512.ClampNative(r, zero, limit);
        g = Vector512.ClampNative(g, zero, limit);
        b = Vector512.ClampNative(b, zero, limit);
        var largest = Vector512.MaxNative(r, Vector512.MaxNative(g, b));
        var down = Vector512.ConditionalSelect(Vector512.GreaterThanOrEqual(largest, pixMax), pixMax * Reciprocal512(largest), Vector512<float>.One);
        r = Vector512.MinNative(r * down, pixMax);
        g = Vector512.MinNative(g * down, pixMax);
        b = Vector512.MinNative(b * down, pixMax);
        return (Vector512.ConvertToInt32Native(r), Vector512.ConvertToInt32Native(g), Vector512.ConvertToInt32Native(b));
    }

    /// <summary>
    /// sqrt(a) for a ≥ 1 from the 14-bit reciprocal square root estimate and one Newton step (relative error near
    /// 2^-23): the divider and square-root unit, not the arithmetic, bound this loop otherwise.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static (Vector512<float>, Vector512<float>) Sqrt512(Vector512<float> a0, Vector512<float> a1)
    {
        var half = Vector512.Create(0.5f);
        var y0 = Avx512F.ReciprocalSqrt14(a0);
        var y1 = Avx512F.ReciprocalSqrt14(a1);
        var root0 = a0 * y0;
        var root1 = a1 * y1;
        var h0 = y0 * half;
        var h1 = y1 * half;
        return (Vector512.FusedMultiplyAdd(root0, Vector512.FusedMultiplyAdd(-root0, h0, half), root0),
            Vector512.FusedMultiplyAdd(root1, Vector512.FusedMultiplyAdd(-root1, h1, half), root1));
    }

    /// <summary>1 / a for normal a from the 14-bit estimate and one Newton step.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector512<float> Reciprocal512(Vector512<float> a)
    {
        var y = Avx512F.Reciprocal14(a);
        return Vector512.FusedMultiplyAdd(y, Vector512.FusedMultiplyAdd(-a, y, Vector512<float>.One), y);
    }

    /// <summary>
    /// Natural log of normal y ≥ 1 (the asinh argument is x + sqrt(x² + 1) with x ≥ 0.125): y = m·2^e with m in
    /// [√½, √2) (e = floor(log2(y√2)) by vgetexpps, m by the exact vscalefps; a rounding of y√2 only moves m an ulp
    /// past the interval), log m from the minimax polynomial of Cephes' logf (S. Moshier; coefficients from memory,
    /// checked against the astropy reference tests), and ln 2 in two parts so e·ln 2 keeps float32 precision.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static (Vector512<float>, Vector512<float>) Log512(Vector512<float> y0, Vector512<float> y1)
    {
        var sqrt2 = Vector512.Create(1.41421356f);
        var e0 = Avx512F.GetExponent(y0 * sqrt2);
        var e1 = Avx512F.GetExponent(y1 * sqrt2);
        var t0 = Avx512F.Scale(y0, -e0) - Vector512<float>.One;
        var t1 = Avx512F.Scale(y1, -e1) - Vector512<float>.One;
        return (LogTail(t0, e0), LogTail(t1, e1));
    }

    /// <summary>log(1 + t) + e·ln 2 for t in [√½ - 1, √2 - 1); the polynomial by Estrin's scheme for a shorter chain.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector512<float> LogTail(Vector512<float> t, Vector512<float> e)
    {
        var t2 = t * t;
        var t4 = t2 * t2;
        var p01 = Vector512.FusedMultiplyAdd(Vector512.Create(-2.4999993993e-1f), t, Vector512.Create(3.3333331174e-1f));
        var p23 = Vector512.FusedMultiplyAdd(Vector512.Create(-1.6668057665e-1f), t, Vector512.Create(2.0000714765e-1f));
        var p45 = Vector512.FusedMultiplyAdd(Vector512.Create(-1.2420140846e-1f), t, Vector512.Create(1.4249322787e-1f));
        var p67 = Vector512.FusedMultiplyAdd(Vector512.Create(-1.1514610310e-1f), t, Vector512.Create(1.1676998740e-1f));
        var p03 = Vector512.FusedMultiplyAdd(p23, t2, p01);
        var p47 = Vector512.FusedMultiplyAdd(p67, t2, p45);
        var p = Vector512.FusedMultiplyAdd(Vector512.FusedMultiplyAdd(t4, Vector512.Create(7.0376836292e-2f), p47), t4, p03);
        var rest = Vector512.FusedMultiplyAdd(e, Vector512.Create(-2.12194440e-4f), t * t2 * p);
        rest = Vector512.FusedMultiplyAdd(Vector512.Create(-0.5f), t2, rest);
        return Vector512.FusedMultiplyAdd(e, Vector512.Create(0.693359375f), t + rest);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector<float> Asinh(Vector<float> x)
    {
        var x2 = x * x;
        var series = x * (Vector<float>.One + x2 * (new Vector<float>(-1f / 6) + x2 * (new Vector<float>(3f / 40) + x2 * new Vector<float>(-5f / 112))));
        var log = Vector.Log(x + Vector.SquareRoot(x2 + Vector<float>.One));
        return Vector.ConditionalSelect(Vector.LessThan(x, new Vector<float>(SeriesLimit)), series, log);
    }

    /// <summary>One pixel by the same operations as the vector loop (its tail, and any machine without vectors).</summary>
    private (byte Red, byte Green, byte Blue) Pixel(float red, float green, float blue)
    {
        if (float.IsNaN(red) || float.IsNaN(green) || float.IsNaN(blue)) return (0, 0, 0);
        var r = Math.Clamp((red - _minRed) * _scaleRed, -ChannelLimit, ChannelLimit);
        var g = Math.Clamp((green - _minGreen) * _scaleGreen, -ChannelLimit, ChannelLimit);
        var b = Math.Clamp((blue - _minBlue) * _scaleBlue, -ChannelLimit, ChannelLimit);
        var intensity = (r + g + b) / 3f;
        var x = Math.Clamp(intensity * _soften, 0f, ArgumentLimit);
        var factor = intensity > 0 ? Asinh(x) * _slope / intensity : 0f;
        r = Math.Clamp(r * factor, 0f, ChannelLimit);
        g = Math.Clamp(g * factor, 0f, ChannelLimit);
        b = Math.Clamp(b * factor, 0f, ChannelLimit);
        var largest = MathF.Max(r, MathF.Max(g, b));
        var down = largest >= PixMax ? PixMax / largest : 1f;
        r *= down;
        g *= down;
        b *= down;
        return ((byte)MathF.Min(r, PixMax), (byte)MathF.Min(g, PixMax), (byte)MathF.Min(b, PixMax));
    }

    private static float Asinh(float x)
    {
        if (x < SeriesLimit)
        {
            var x2 = x * x;
            return x * (1f + x2 * (-1f / 6 + x2 * (3f / 40 + x2 * (-5f / 112))));
        }
        return MathF.Log(x + MathF.Sqrt(x * x + 1f));
    }
}
