using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
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
        if (Vector.IsHardwareAccelerated)
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
