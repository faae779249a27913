using System.Numerics;
using System.Runtime.InteropServices;
using Mosaic.Imaging.Display.Limits;

namespace Mosaic.Imaging.Rendering;

/// <summary>
/// Exact levels for curves too steep for any table: the u where the level changes, found by bisection in double,
/// and a branch-free binary search per pixel. Slower than the table (some ns a pixel) but within rounding of the
/// formula for any curve whose level changes are at least one table step apart.
/// </summary>
internal sealed class LevelBreaks
{
    private readonly double _lo;
    private readonly double _width;
    // Ascending u of each change padded with +infinity to a power of two; _segments[k] is the level with k breaks at or below u.
    private readonly double[] _breaks;
    private readonly byte[] _segments;

    private LevelBreaks(ValueRange limits, double[] breaks, byte[] segments)
    {
        _lo = limits.Lo;
        _width = limits.Width;
        _breaks = breaks;
        _segments = segments;
    }

    public long RetainedBytes => 8L * _breaks.Length + _segments.Length;

    public static LevelBreaks Find(ValueRange limits, LevelFunction levelOf, LookupTable table)
    {
        var breaks = new List<double>();
        var segments = new List<byte> { table[0] };
        double last = table.Entries - 1;
        for (var i = 0; i + 1 < table.Entries; i++)
        {
            if (table[i] != table[i + 1]) Split(levelOf, i / last, (i + 1) / last, table[i], table[i + 1], breaks, segments);
        }
        var padded = (int)BitOperations.RoundUpToPowerOf2((uint)breaks.Count + 1);
        var breakArray = new double[padded];
        breaks.CopyTo(breakArray);
        Array.Fill(breakArray, double.PositiveInfinity, breaks.Count, padded - breaks.Count);
        var segmentArray = new byte[padded + 1];
        segments.CopyTo(segmentArray);
        return new LevelBreaks(limits, breakArray, segmentArray);
    }

    // Every change between a and b (levels la, lb), ascending; at double resolution a jump is one break.
    private static void Split(LevelFunction levelOf, double a, double b, byte la, byte lb, List<double> breaks, List<byte> segments)
    {
        while (true)
        {
            var m = a + (b - a) / 2;
            if (m <= a || m >= b)
            {
                breaks.Add(b);
                segments.Add(lb);
                return;
            }
            var lm = levelOf.At(m);
            if (lm == la) { a = m; continue; }
            if (lm == lb) { b = m; continue; }
            Split(levelOf, a, m, la, lm, breaks, segments);
            a = m;
            la = lm;
        }
    }

    public int Apply(ReadOnlySpan<float> values, Span<byte> levels)
    {
        var breaks = _breaks;
        var segments = _segments;
        var half = breaks.Length / 2;
        var masked = 0;
        for (var i = 0; i < values.Length; i++)
        {
            var v = values[i];
            if (float.IsNaN(v)) { levels[i] = 0; masked++; continue; }
            var u = Math.Clamp((v - _lo) / _width, 0, 1);
            // Count of breaks <= u, by halving steps over the power-of-two array.
            var k = 0;
            for (var step = half; step > 0; step >>= 1)
                if (breaks[k + step - 1] <= u) k += step;
            levels[i] = segments[k];
        }
        return masked;
    }
}
