using System.Runtime.CompilerServices;

namespace Mosaic.Canvas.Resampling;

/// <summary>Bounds the steps of a linear walk that can reach a range, so pixels outside a chip cost nothing.</summary>
internal static class StepWindow
{
    /// <summary>Smallest step size narrowed on; flatter walks keep their steps (the margin would not cover rounding).</summary>
    private const double MinStep = 1e-6;

    /// <summary>
    /// Narrows steps [first, end) to those m where start + step * m may lie in [low, high), keeping one step of margin
    /// on each side so rounding never drops a step that lies inside; the caller still tests each kept step exactly.
    /// Start and step must be finite.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static void Narrow(double start, double step, double low, double high, ref int first, ref int end)
    {
        if (!(Math.Abs(step) > MinStep)) return;
        // One division; the margin covers the reciprocal's rounding too.
        var inverse = 1 / step;
        double from = (low - start) * inverse, to = (high - start) * inverse;
        if (step < 0) (from, to) = (to, from);
        // Clamped in double first, so a far-off range never overflows the conversion.
        first = (int)Math.Max(first, Math.Min(end, Math.Floor(from) - 1));
        end = (int)Math.Min(end, Math.Max(first, Math.Ceiling(to) + 1));
    }
}
