using System.Numerics;

namespace Mosaic.Demo.Rendering;

/// <summary>Adds the reflection ghost: a uniform annulus with edges softened over a few pixels, as a defocused pupil looks.</summary>
internal static class GhostStamp
{
    public static void Add(Span<float> image, int width, int height, double cx, double cy, double outer, double inner,
        double surfaceBrightness)
    {
        var soft = Math.Max(1.5, 0.06 * outer);
        var reach = outer + soft;
        var x0 = Math.Max(0, (int)Math.Floor(cx - reach));
        var x1 = Math.Min(width - 1, (int)Math.Ceiling(cx + reach));
        var y0 = Math.Max(0, (int)Math.Floor(cy - reach));
        var y1 = Math.Min(height - 1, (int)Math.Ceiling(cy + reach));
        if (x0 > x1 || y0 > y1) return;

        var n = Vector<float>.Count;
        var vOuter = new Vector<float>((float)(outer / soft + 0.5));
        var vInner = new Vector<float>((float)(inner / soft - 0.5));
        var vInvSoft = new Vector<float>((float)(1 / soft));
        var vSb = new Vector<float>((float)surfaceBrightness);
        for (var y = y0; y <= y1; y++)
        {
            var row = image.Slice(y * width + x0, x1 - x0 + 1);
            var dy = (float)(y - cy);
            var vDy2 = new Vector<float>(dy * dy);
            var first = (float)(x0 - cx);
            var i = 0;
            for (; i <= row.Length - n; i += n)
            {
                var dx = new Vector<float>(first + i) + Vector<float>.Indices;
                var r = Vector.SquareRoot(dx * dx + vDy2) * vInvSoft;
                // Two clamped ramps: rising past the inner edge, falling past the outer one.
                var rise = Vector.Min(Vector<float>.One, Vector.Max(Vector<float>.Zero, r - vInner));
                var fall = Vector.Min(Vector<float>.One, Vector.Max(Vector<float>.Zero, vOuter - r));
                (new Vector<float>(row[i..]) + vSb * rise * fall).CopyTo(row[i..]);
            }
            for (; i < row.Length; i++)
            {
                var dx = first + i;
                var r = MathF.Sqrt(dx * dx + dy * dy) * (float)(1 / soft);
                var rise = Math.Clamp(r - (float)(inner / soft - 0.5), 0f, 1f);
                var fall = Math.Clamp((float)(outer / soft + 0.5) - r, 0f, 1f);
                row[i] += (float)surfaceBrightness * rise * fall;
            }
        }
    }
}
