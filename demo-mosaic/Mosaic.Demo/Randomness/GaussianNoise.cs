using System.Numerics;

namespace Mosaic.Demo.Randomness;

/// <summary>Standard normal deviates for pixel noise: uniforms from xoshiro256**, then a vectorised Box–Muller transform.</summary>
internal static class GaussianNoise
{
    private const float TwoToMinus24 = 1f / (1 << 24);

    /// <summary>
    /// Fills <paramref name="destination"/> with N(0, 1) values. Callers keep the length a multiple of
    /// 2 × Vector&lt;float&gt;.Count so every value takes the vector path and the output depends only on the stream.
    /// </summary>
    public static void Fill(Xoshiro256StarStar rng, Span<float> destination)
    {
        var half = destination.Length / 2;
        var radii = destination[..half];
        var angles = destination.Slice(half, half);
        for (var i = 0; i < half; i++)
        {
            var r = rng.NextUInt64();
            // 24-bit uniforms: (0, 1] for the logarithm, [0, 1) for the angle.
            radii[i] = ((uint)(r >> 40) + 1u) * TwoToMinus24;
            angles[i] = (uint)((r >> 8) & 0xFFFFFF) * TwoToMinus24;
        }

        var width = Vector<float>.Count;
        var twoPi = new Vector<float>(2f * MathF.PI);
        var minusTwo = new Vector<float>(-2f);
        var k = 0;
        for (; k <= half - width; k += width)
        {
            var u1 = new Vector<float>(radii[k..]);
            var u2 = new Vector<float>(angles[k..]);
            var radius = Vector.SquareRoot(Vector.Log(u1) * minusTwo);
            var (sin, cos) = Vector.SinCos(u2 * twoPi);
            (radius * cos).CopyTo(radii[k..]);
            (radius * sin).CopyTo(angles[k..]);
        }
        for (; k < half; k++)
        {
            var radius = MathF.Sqrt(-2f * MathF.Log(radii[k]));
            var (sin, cos) = MathF.SinCos(angles[k] * 2f * MathF.PI);
            radii[k] = radius * cos;
            angles[k] = radius * sin;
        }
        if ((destination.Length & 1) == 1)
        {
            var r = rng.NextUInt64();
            var u1 = ((uint)(r >> 40) + 1u) * TwoToMinus24;
            var u2 = (uint)((r >> 8) & 0xFFFFFF) * TwoToMinus24;
            destination[^1] = MathF.Sqrt(-2f * MathF.Log(u1)) * MathF.Cos(u2 * 2f * MathF.PI);
        }
    }
}
