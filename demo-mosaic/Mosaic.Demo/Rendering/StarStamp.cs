using System.Numerics;

namespace Mosaic.Demo.Rendering;

/// <summary>Adds one Moffat star to a chip, sampled at pixel centres over a disc whose radius the caller sets by brightness.</summary>
internal static class StarStamp
{
    public static void Add(Span<float> image, int width, int height, double cx, double cy, double flux,
        double fwhm, double beta, double radius)
    {
        var x0 = Math.Max(0, (int)Math.Floor(cx - radius));
        var x1 = Math.Min(width - 1, (int)Math.Ceiling(cx + radius));
        var y0 = Math.Max(0, (int)Math.Floor(cy - radius));
        var y1 = Math.Min(height - 1, (int)Math.Ceiling(cy + radius));
        if (x0 > x1 || y0 > y1) return;

        var alpha = MoffatProfile.Alpha(fwhm, beta);
        var amplitude = (float)(flux * MoffatProfile.PeakFraction(fwhm, beta));
        var invAlpha2 = (float)(1 / (alpha * alpha));
        var minusBeta = (float)-beta;
        var r2Max = radius * radius;
        var width1 = Vector<float>.Count;
        var vAmp = new Vector<float>(amplitude);
        var vInv = new Vector<float>(invAlpha2);
        var vMinusBeta = new Vector<float>(minusBeta);

        for (var y = y0; y <= y1; y++)
        {
            var dy = y - cy;
            var dy2 = dy * dy;
            if (dy2 > r2Max) continue;
            var half = Math.Sqrt(r2Max - dy2);
            var xs = Math.Max(x0, (int)Math.Ceiling(cx - half));
            var xe = Math.Min(x1, (int)Math.Floor(cx + half));
            if (xs > xe) continue;
            var row = image.Slice(y * width + xs, xe - xs + 1);
            var first = (float)(xs - cx);
            var vDy2 = new Vector<float>((float)dy2);
            var i = 0;
            for (; i <= row.Length - width1; i += width1)
            {
                var dx = new Vector<float>(first + i) + Vector<float>.Indices;
                var t = Vector<float>.One + (dx * dx + vDy2) * vInv;
                var value = vAmp * Vector.Exp(Vector.Log(t) * vMinusBeta);
                (new Vector<float>(row[i..]) + value).CopyTo(row[i..]);
            }
            for (; i < row.Length; i++)
            {
                var dx = first + i;
                var t = 1f + (dx * dx + (float)dy2) * invAlpha2;
                row[i] += amplitude * MathF.Exp(MathF.Log(t) * minusBeta);
            }
        }
    }
}
