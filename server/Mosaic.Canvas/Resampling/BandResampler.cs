using System.Buffers;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;
using Mosaic.Canvas.Mapping;

namespace Mosaic.Canvas.Resampling;

/// <summary>
/// Fills a box of canvas pixels from the chips of a band (the method is described on <see cref="CanvasPlane"/>).
/// Each chip is read only over the rectangle of chip pixels the box needs, found from the grid nodes (bilinear
/// positions never leave the hull of their four nodes); a box whose rectangle would exceed
/// <see cref="MaxRectPixels"/> is split first by columns, then by rows. Buffers are pooled per call, so calls may run
/// on several threads at once.
/// <para>Speed: within a grid cell the chip position is linear along a canvas row, so each cell's pixels are the
/// steps start + step m; the steps off the chip are cut away up front (<see cref="StepWindow"/>), and where no other
/// chip competes and the nodes are finite the rest go eight (AVX-512) or four (AVX2) at a time with gathered chip
/// values, or plain loads where the lanes' chip pixels are neighbours in one chip row (as at about the chip's own
/// scale). Every path computes the same expressions in the same order, so results do not depend on the path.</para>
/// </summary>
internal static class BandResampler
{
    /// <summary>Most chip pixels read into memory at once for one chip (4 MiB of floats).</summary>
    public const int MaxRectPixels = 1 << 20;

    /// <summary>Canvas rows [y0, y0 + rows) and columns [x0, x0 + columns), 0-based, into destination (rows * columns, row-major).</summary>
    public static void Resample(CanvasBand band, int y0, int rows, int x0, int columns, Span<float> destination)
    {
        destination = destination[..(rows * columns)];
        destination.Fill(float.NaN);
        double[]? best = null;
        try
        {
            if (band.Overlapping)
            {
                best = ArrayPool<double>.Shared.Rent(rows * columns);
                best.AsSpan(0, rows * columns).Fill(double.PositiveInfinity);
            }
            var box = new OutputBox(y0, x0, columns, band.Chips as PlacedChip[] ?? [.. band.Chips]);
            foreach (var chip in band.Chips)
            {
                if (chip.IsEmpty) continue;
                int rs = Math.Max(y0, chip.FirstRow), re = Math.Min(y0 + rows - 1, chip.LastRow);
                int cs = Math.Max(x0, chip.FirstColumn), ce = Math.Min(x0 + columns - 1, chip.LastColumn);
                if (rs > re || cs > ce) continue;
                Split(chip, rs, re, cs, ce, box, destination, best);
            }
        }
        finally
        {
            if (best is not null) ArrayPool<double>.Shared.Return(best);
        }
    }

    /// <summary>Where the caller's box sits on the canvas, and the band's chips (the candidates where they overlap).</summary>
    private readonly record struct OutputBox(int Y0, int X0, int Columns, PlacedChip[] Chips);

    private static void Split(PlacedChip chip, int rs, int re, int cs, int ce, OutputBox box, Span<float> destination, double[]? best)
    {
        var G = chip.Grid.Spacing;
        if (!TryRect(chip, rs, re, cs, ce, out var rx0, out var ry0, out var rx1, out var ry1)) return;
        var area = (long)(rx1 - rx0 + 1) * (ry1 - ry0 + 1);
        if (area > MaxRectPixels)
        {
            if (ce - cs + 1 > G)
            {
                // Split on a cell boundary, so both halves use whole cells.
                var mid = Math.Max(cs + 1, (cs + (ce - cs + 1) / 2) / G * G);
                Split(chip, rs, re, cs, mid - 1, box, destination, best);
                Split(chip, rs, re, mid, ce, box, destination, best);
                return;
            }
            if (re > rs)
            {
                var mid = rs + (re - rs + 1) / 2;
                Split(chip, rs, mid - 1, cs, ce, box, destination, best);
                Split(chip, mid, re, cs, ce, box, destination, best);
                return;
            }
        }
        var buffer = ArrayPool<float>.Shared.Rent((int)area);
        try
        {
            var rect = new ChipRect(rx0, ry0, rx1, ry1, buffer.AsSpan(0, (int)area));
            for (var ry = ry0; ry <= ry1; ry++)
                chip.Plane.ReadRow(ry, rx0, rect.Values.Slice((ry - ry0) * rect.Width, rect.Width));
            Fill(chip, rs, re, cs, ce, rect, box, destination, best);
        }
        finally
        {
            ArrayPool<float>.Shared.Return(buffer);
        }
    }

    /// <summary>The chip pixels (0-based, inclusive) that canvas rows [rs, re] x columns [cs, ce] can touch; false when none.</summary>
    private static bool TryRect(PlacedChip chip, int rs, int re, int cs, int ce, out int x0, out int y0, out int x1, out int y1)
    {
        var grid = chip.Grid;
        var G = grid.Spacing;
        double minU = double.PositiveInfinity, maxU = double.NegativeInfinity, minV = double.PositiveInfinity, maxV = double.NegativeInfinity;
        int k0 = cs / G - grid.FirstColumn, k1 = ce / G + 1 - grid.FirstColumn;
        // A position is bilinear in its cell, so over rows [a, b] of a cell it lies within the node columns
        // interpolated at rows a and b, computed as Fill computes them. Bounding by those rather than by the cell's
        // node rows keeps a strip of a few rows from reading the chip rows of whole cells (G rows or more).
        for (int j = rs / G, jEnd = re / G; j <= jEnd; j++)
        {
            double[] top = grid.Row(j), bottom = grid.Row(j + 1);
            int a = Math.Max(rs, j * G), b = Math.Min(re, j * G + G - 1);
            for (var end = 0; end < 2; end++)
            {
                double fy = (double)((end == 0 ? a : b) - j * G) / G;
                for (var k = k0; k <= k1; k++)
                {
                    int at = 2 * k;
                    double u = top[at] + fy * (bottom[at] - top[at]) - 1, v = top[at + 1] + fy * (bottom[at + 1] - top[at + 1]) - 1;
                    if (double.IsNaN(u) || double.IsNaN(v))
                    {
                        // A node without a sky solution: its cell goes by the exact chain, so keep the finite nodes' hull.
                        Include(top[at] - 1, top[at + 1] - 1, ref minU, ref maxU, ref minV, ref maxV);
                        Include(bottom[at] - 1, bottom[at + 1] - 1, ref minU, ref maxU, ref minV, ref maxV);
                        continue;
                    }
                    Include(u, v, ref minU, ref maxU, ref minV, ref maxV);
                }
            }
        }
        int width = chip.Plane.Width, height = chip.Plane.Height;
        x0 = y0 = 0;
        x1 = y1 = -1;
        if (double.IsInfinity(minU) || double.IsInfinity(minV)) return false;
        // Bilinear reads floor(u) and floor(u) + 1; nearest reads floor(u + 0.5): both within [floor(min), floor(max) + 1].
        x0 = (int)Math.Max(0, Math.Floor(Math.Max(minU, -1)));
        x1 = (int)Math.Min(width - 1, Math.Floor(Math.Min(maxU, width)) + 1);
        y0 = (int)Math.Max(0, Math.Floor(Math.Max(minV, -1)));
        y1 = (int)Math.Min(height - 1, Math.Floor(Math.Min(maxV, height)) + 1);
        return x0 <= x1 && y0 <= y1;
    }

    private static void Include(double u, double v, ref double minU, ref double maxU, ref double minV, ref double maxV)
    {
        if (double.IsNaN(u) || double.IsNaN(v)) return;
        minU = Math.Min(minU, u); maxU = Math.Max(maxU, u);
        minV = Math.Min(minV, v); maxV = Math.Max(maxV, v);
    }

    // Runs once per build in a short-lived process: compiled optimised at first call, not after tiering catches up.
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void Fill(PlacedChip chip, int rs, int re, int cs, int ce, ChipRect rect, OutputBox box, Span<float> destination, double[]? best)
    {
        var grid = chip.Grid;
        var G = grid.Spacing;
        int k0 = cs / G, k1 = ce / G + 1, nodes = k1 - k0 + 1;
        // G is a power of two, so multiplying by its reciprocal is exact: the same bits as dividing, without a division per cell.
        var perNode = 1.0 / G;
        var scratch = ArrayPool<double>.Shared.Rent(2 * nodes);
        try
        {
            var nodeX = scratch.AsSpan(0, nodes);
            var nodeY = scratch.AsSpan(nodes, nodes);
            int width = chip.Plane.Width, height = chip.Plane.Height;
            double centreX = chip.Centre.X, centreY = chip.Centre.Y, uEnd = width - 0.5, vEnd = height - 0.5;
            var values = rect.Values;
            ref var origin = ref MemoryMarshal.GetReference(values);
            int rx0 = rect.X0, ry0 = rect.Y0, rx1 = rect.X1, ry1 = rect.Y1, rw = rect.Width;
            for (var r = rs; r <= re; r++)
            {
                var j = r / G;
                double fy = (double)(r - j * G) / G;
                double[] a = grid.Row(j), b = grid.Row(j + 1);
                var first = k0 - grid.FirstColumn;
                for (var k = 0; k < nodes; k++)
                {
                    int at = 2 * (first + k);
                    nodeX[k] = a[at] + fy * (b[at] - a[at]);
                    nodeY[k] = a[at + 1] + fy * (b[at + 1] - a[at + 1]);
                }
                var outRow = destination.Slice((r - box.Y0) * box.Columns, box.Columns);
                var bestRow = best is null ? default : best.AsSpan((r - box.Y0) * box.Columns, box.Columns);
                double canvasY = r + 1;
                // Per cell the position walks linearly between its two nodes: start + step * m for the m-th pixel.
                for (int c = cs, k = cs / G; c <= ce; k++)
                {
                    var end = Math.Min(ce, k * G + G - 1);
                    double t0 = (c - k * G) * perNode;
                    int kk = k - k0;
                    double sx = (nodeX[kk + 1] - nodeX[kk]) * perNode, sy = (nodeY[kk + 1] - nodeY[kk]) * perNode;
                    double startX = nodeX[kk] + t0 * G * sx, startY = nodeY[kk] + t0 * G * sy;
                    int lo = 0, hi = end - c + 1;
                    // Gap and edge pixels are skipped without work; a cell with a NaN node keeps every pixel for the exact chain.
                    if (double.IsFinite(startX) && double.IsFinite(sx) && double.IsFinite(startY) && double.IsFinite(sy))
                    {
                        StepWindow.Narrow(startX, sx, 0.5, uEnd + 1, ref lo, ref hi);
                        StepWindow.Narrow(startY, sy, 0.5, vEnd + 1, ref lo, ref hi);
                        // Where no other chip's box reaches, the overlap rule has nothing to decide.
                        if (best is null || !Contested(chip, box.Chips, r, c, end))
                        {
                            if (lo < hi) FillCell(chip, rect, startX, sx, startY, sy, lo, hi, outRow.Slice(c - box.X0, end - c + 1));
                            c = end + 1;
                            continue;
                        }
                    }
                    for (var m = lo; m < hi; m++)
                    {
                        double u = startX + sx * m - 1, v = startY + sy * m - 1;
                        var column = c + m;
                        if (!(u >= -0.5 && u < uEnd && v >= -0.5 && v < vEnd))
                        {
                            // NaN fails every comparison: a grid node without a sky solution, so this pixel by the exact chain.
                            if (!double.IsNaN(u) && !double.IsNaN(v)) continue;
                            if (!grid.Chain.TryCanvasToChip(column + 1, canvasY, out u, out v)) continue;
                            u -= 1; v -= 1;
                            if (!(u >= -0.5 && u < uEnd && v >= -0.5 && v < vEnd)) continue;
                        }
                        var o = column - box.X0;
                        if (best is not null)
                        {
                            double dx = column + 1 - centreX, dy = canvasY - centreY;
                            var d = dx * dx + dy * dy;
                            if (d >= bestRow[o]) continue;
                            bestRow[o] = d;
                        }
                        // floor for u >= -1, without a call.
                        int pi = (int)(u + 1) - 1, pj = (int)(v + 1) - 1;
                        if ((uint)(pi - rx0) < (uint)(rx1 - rx0) && (uint)(pj - ry0) < (uint)(ry1 - ry0))
                        {
                            // The four neighbours are in the rectangle (so inside the chip), which the test above
                            // proves, so no bounds checks: bilinear, finite exactly when all four are (a NaN or
                            // infinity survives even a zero weight).
                            ref var p = ref Unsafe.Add(ref origin, (pj - ry0) * rw + (pi - rx0));
                            ref var q = ref Unsafe.Add(ref p, rw);
                            double wx = u - pi, wy = v - pj;
                            var value = (1 - wy) * ((1 - wx) * p + wx * Unsafe.Add(ref p, 1)) + wy * ((1 - wx) * q + wx * Unsafe.Add(ref q, 1));
                            if (double.IsFinite(value))
                            {
                                outRow[o] = (float)value;
                                continue;
                            }
                        }
                        outRow[o] = Sample(chip, rect, u, v, width, height);
                    }
                    c = end + 1;
                }
            }
        }
        finally
        {
            ArrayPool<double>.Shared.Return(scratch);
        }
    }

    /// <summary>Another chip's canvas box holds part of row r, columns [c0, c1] (0-based).</summary>
    private static bool Contested(PlacedChip chip, PlacedChip[] chips, int r, int c0, int c1)
    {
        foreach (var other in chips)
            if (!ReferenceEquals(other, chip) && !other.IsEmpty && other.FirstRow <= r && r <= other.LastRow && other.FirstColumn <= c1 && c0 <= other.LastColumn)
                return true;
        return false;
    }

    /// <summary>
    /// Steps [lo, hi) of one cell of one canvas row, for the common case: finite nodes, no overlap to settle. Four
    /// pixels at a time where AVX2 is there (their chip values gathered, the same arithmetic lane by lane, so the
    /// same bits); a group with a pixel off the chip, at the rectangle's edge or next to a NaN goes pixel by pixel.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static unsafe void FillCell(PlacedChip chip, ChipRect rect, double startX, double sx, double startY, double sy, int lo, int hi, Span<float> output)
    {
        var m = lo;
        if (Avx512F.IsSupported && hi - lo >= Vector512<double>.Count) m = FillCellWide(chip, rect, startX, sx, startY, sy, lo, hi, output);
        if (Avx2.IsSupported && hi - m >= Vector256<double>.Count)
        {
            var one = Vector256<double>.One;
            var low = Vector256.Create(-0.5);
            var uEnd = Vector256.Create(chip.Plane.Width - 0.5);
            var vEnd = Vector256.Create(chip.Plane.Height - 0.5);
            Vector256<double> x0 = Vector256.Create(startX), y0 = Vector256.Create(startY), dx = Vector256.Create(sx), dy = Vector256.Create(sy);
            var lanes = Vector256.Create(0.0, 1, 2, 3);
            Vector128<int> originX = Vector128.Create(rect.X0), originY = Vector128.Create(rect.Y0);
            Vector128<int> limitX = Vector128.Create(rect.X1 - rect.X0), limitY = Vector128.Create(rect.Y1 - rect.Y0);
            var stride = Vector128.Create(rect.Width);
            var rw = rect.Width;
            var steady = Vector128.Create(0, 1, 2, 3);
            fixed (float* values = rect.Values)
            fixed (float* target = output)
            {
                for (; m <= hi - Vector256<double>.Count; m += Vector256<double>.Count)
                {
                    var steps = Vector256.Create((double)m) + lanes;
                    var u = x0 + dx * steps - one;
                    var v = y0 + dy * steps - one;
                    var inside = Vector256.GreaterThanOrEqual(u, low) & Vector256.LessThan(u, uEnd) & Vector256.GreaterThanOrEqual(v, low) & Vector256.LessThan(v, vEnd);
                    var pi = Avx.ConvertToVector128Int32WithTruncation(u + one) - Vector128<int>.One;
                    var pj = Avx.ConvertToVector128Int32WithTruncation(v + one) - Vector128<int>.One;
                    Vector128<int> ix = pi - originX, iy = pj - originY;
                    var held = Vector128.GreaterThanOrEqual(ix, Vector128<int>.Zero) & Vector128.LessThan(ix, limitX)
                        & Vector128.GreaterThanOrEqual(iy, Vector128<int>.Zero) & Vector128.LessThan(iy, limitY);
                    if (inside.ExtractMostSignificantBits() != 0xF || held.ExtractMostSignificantBits() != 0xF)
                    {
                        FillPixels(chip, rect, startX, sx, startY, sy, m, m + Vector256<double>.Count, output);
                        continue;
                    }
                    Vector256<double> p00, p10, p01, p11;
                    var firstX = ix.ToScalar();
                    var firstY = iy.ToScalar();
                    if ((Vector128.Equals(ix, Vector128.Create(firstX) + steady) & Vector128.Equals(iy, Vector128.Create(firstY))).ExtractMostSignificantBits() == 0xF)
                    {
                        // Four neighbouring columns of one chip row: plain loads of the floats a gather would fetch.
                        var row = values + (firstY * rw + firstX);
                        p00 = Avx.ConvertToVector256Double(Vector128.Load(row));
                        p10 = Avx.ConvertToVector256Double(Vector128.Load(row + 1));
                        p01 = Avx.ConvertToVector256Double(Vector128.Load(row + rw));
                        p11 = Avx.ConvertToVector256Double(Vector128.Load(row + rw + 1));
                    }
                    else
                    {
                        var at = iy * stride + ix;
                        p00 = Avx.ConvertToVector256Double(Avx2.GatherVector128(values, at, sizeof(float)));
                        p10 = Avx.ConvertToVector256Double(Avx2.GatherVector128(values + 1, at, sizeof(float)));
                        p01 = Avx.ConvertToVector256Double(Avx2.GatherVector128(values + rw, at, sizeof(float)));
                        p11 = Avx.ConvertToVector256Double(Avx2.GatherVector128(values + rw + 1, at, sizeof(float)));
                    }
                    var wx = u - Avx.ConvertToVector256Double(pi);
                    var wy = v - Avx.ConvertToVector256Double(pj);
                    var value = (one - wy) * ((one - wx) * p00 + wx * p10) + wy * ((one - wx) * p01 + wx * p11);
                    // x - x is 0 exactly when x is finite.
                    if (Vector256.Equals(value - value, Vector256<double>.Zero).ExtractMostSignificantBits() != 0xF)
                    {
                        FillPixels(chip, rect, startX, sx, startY, sy, m, m + Vector256<double>.Count, output);
                        continue;
                    }
                    Avx.ConvertToVector128Single(value).Store(target + m);
                }
            }
        }
        FillPixels(chip, rect, startX, sx, startY, sy, m, hi, output);
    }

    /// <summary>
    /// <see cref="FillCell"/> eight pixels at a time with AVX-512; returns the first step not done. The steps whose
    /// four neighbours all lie in the rectangle are found once per cell (<see cref="HeldSteps"/>), so the loop tests
    /// only that its values are finite.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static unsafe int FillCellWide(PlacedChip chip, ChipRect rect, double startX, double sx, double startY, double sy, int lo, int hi, Span<float> output)
    {
        const int Lanes = 8;
        HeldSteps(chip, rect, startX, sx, startY, sy, lo, hi, out var first, out var end);
        if (end - first < Lanes) return lo;
        FillPixels(chip, rect, startX, sx, startY, sy, lo, first, output);
        var m = first;
        var one = Vector512<double>.One;
        Vector512<double> x0 = Vector512.Create(startX), y0 = Vector512.Create(startY), dx = Vector512.Create(sx), dy = Vector512.Create(sy);
        var lanes = Vector512.Create(0.0, 1, 2, 3, 4, 5, 6, 7);
        Vector256<int> originX = Vector256.Create(rect.X0), originY = Vector256.Create(rect.Y0);
        var stride = Vector256.Create(rect.Width);
        var rw = rect.Width;
        var steady = Vector256.Create(0, 1, 2, 3, 4, 5, 6, 7);
        fixed (float* values = rect.Values)
        fixed (float* target = output)
        {
            for (; m <= end - Lanes; m += Lanes)
            {
                var steps = Vector512.Create((double)m) + lanes;
                var u = x0 + dx * steps - one;
                var v = y0 + dy * steps - one;
                var pi = Avx512F.ConvertToVector256Int32WithTruncation(u + one) - Vector256<int>.One;
                var pj = Avx512F.ConvertToVector256Int32WithTruncation(v + one) - Vector256<int>.One;
                Vector256<int> ix = pi - originX, iy = pj - originY;
                Vector512<double> p00, p10, p01, p11;
                var firstX = ix.ToScalar();
                var firstY = iy.ToScalar();
                if ((Vector256.Equals(ix, Vector256.Create(firstX) + steady) & Vector256.Equals(iy, Vector256.Create(firstY))).ExtractMostSignificantBits() == 0xFF)
                {
                    // Eight neighbouring chip columns of one chip row (the usual case at a canvas of about the chip's
                    // scale): plain loads of the same floats a gather would fetch, at a fraction of its cost.
                    var row = values + (firstY * rw + firstX);
                    p00 = Avx512F.ConvertToVector512Double(Vector256.Load(row));
                    p10 = Avx512F.ConvertToVector512Double(Vector256.Load(row + 1));
                    p01 = Avx512F.ConvertToVector512Double(Vector256.Load(row + rw));
                    p11 = Avx512F.ConvertToVector512Double(Vector256.Load(row + rw + 1));
                }
                else
                {
                    var at = iy * stride + ix;
                    p00 = Avx512F.ConvertToVector512Double(Avx2.GatherVector256(values, at, sizeof(float)));
                    p10 = Avx512F.ConvertToVector512Double(Avx2.GatherVector256(values + 1, at, sizeof(float)));
                    p01 = Avx512F.ConvertToVector512Double(Avx2.GatherVector256(values + rw, at, sizeof(float)));
                    p11 = Avx512F.ConvertToVector512Double(Avx2.GatherVector256(values + rw + 1, at, sizeof(float)));
                }
                var wx = u - Avx512F.ConvertToVector512Double(pi);
                var wy = v - Avx512F.ConvertToVector512Double(pj);
                var value = (one - wy) * ((one - wx) * p00 + wx * p10) + wy * ((one - wx) * p01 + wx * p11);
                // x - x is 0 exactly when x is finite.
                if (Vector512.Equals(value - value, Vector512<double>.Zero).ExtractMostSignificantBits() != 0xFF)
                {
                    FillPixels(chip, rect, startX, sx, startY, sy, m, m + Lanes, output);
                    continue;
                }
                Avx512F.ConvertToVector256Single(value).Store(target + m);
            }
        }
        return m;
    }

    /// <summary>
    /// Steps [first, end) within [lo, hi): those whose position is on the chip and whose four neighbours lie in the
    /// rectangle, the tests <see cref="FillPixels"/> makes, computed as it computes them. Each rounded operation of
    /// start + step m - 1 and its truncation is monotonic in m, so every test holds on an interval of steps and so
    /// does their conjunction: trimming failing steps off both ends finds it, usually within a step or two (the
    /// window is already cut to the chip).
    /// </summary>
    private static void HeldSteps(PlacedChip chip, ChipRect rect, double startX, double sx, double startY, double sy, int lo, int hi, out int first, out int end)
    {
        var bounds = new HeldBounds(chip.Plane.Width - 0.5, chip.Plane.Height - 0.5, rect.X0, rect.Y0, (uint)(rect.X1 - rect.X0), (uint)(rect.Y1 - rect.Y0));
        first = lo;
        while (first < hi && !bounds.Holds(startX + sx * first - 1, startY + sy * first - 1)) first++;
        end = hi;
        while (end > first && !bounds.Holds(startX + sx * (end - 1) - 1, startY + sy * (end - 1) - 1)) end--;
    }

    /// <summary>The tests of <see cref="FillPixels"/> on one 0-based chip position (u, v), in its words.</summary>
    private readonly record struct HeldBounds(double UEnd, double VEnd, int X0, int Y0, uint SpanX, uint SpanY)
    {
        public bool Holds(double u, double v)
        {
            if (!(u >= -0.5 && u < UEnd && v >= -0.5 && v < VEnd)) return false;
            int pi = (int)(u + 1) - 1, pj = (int)(v + 1) - 1;
            return (uint)(pi - X0) < SpanX && (uint)(pj - Y0) < SpanY;
        }
    }

    /// <summary>Steps [lo, hi) of <see cref="FillCell"/> one pixel at a time.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void FillPixels(PlacedChip chip, ChipRect rect, double startX, double sx, double startY, double sy, int lo, int hi, Span<float> output)
    {
        int width = chip.Plane.Width, height = chip.Plane.Height;
        double uEnd = width - 0.5, vEnd = height - 0.5;
        int rx0 = rect.X0, ry0 = rect.Y0, rw = rect.Width;
        uint spanX = (uint)(rect.X1 - rx0), spanY = (uint)(rect.Y1 - ry0);
        ref var origin = ref MemoryMarshal.GetReference(rect.Values);
        ref var target = ref MemoryMarshal.GetReference(output);
        for (var m = lo; m < hi; m++)
        {
            double u = startX + sx * m - 1, v = startY + sy * m - 1;
            // Finite here, so a failed test means outside the chip.
            if (!(u >= -0.5 && u < uEnd && v >= -0.5 && v < vEnd)) continue;
            // floor for u >= -1, without a call.
            int pi = (int)(u + 1) - 1, pj = (int)(v + 1) - 1;
            if ((uint)(pi - rx0) < spanX && (uint)(pj - ry0) < spanY)
            {
                // All four neighbours lie in the rectangle (the test above proves it, so no bounds checks).
                ref var p = ref Unsafe.Add(ref origin, (pj - ry0) * rw + (pi - rx0));
                var value = Bilinear(ref p, rw, u - pi, v - pj);
                if (double.IsFinite(value))
                {
                    Unsafe.Add(ref target, m) = (float)value;
                    continue;
                }
            }
            Unsafe.Add(ref target, m) = Sample(chip, rect, u, v, width, height);
        }
    }

    /// <summary>
    /// (1 - wy) ((1 - wx) p00 + wx p10) + wy ((1 - wx) p01 + wx p11), each product and sum rounded as written; NaN or
    /// infinity when any of the four is (it survives even a zero weight). The vector form widens all four floats at
    /// once: converting them one by one would chain every pixel to the last through the registers' upper halves.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static double Bilinear(ref float p, int rowStride, double wx, double wy)
    {
        ref var q = ref Unsafe.Add(ref p, rowStride);
        if (Avx.IsSupported)
        {
            var four = Vector128.Create(
                Unsafe.ReadUnaligned<long>(ref Unsafe.As<float, byte>(ref p)),
                Unsafe.ReadUnaligned<long>(ref Unsafe.As<float, byte>(ref q))).AsSingle();
            var weighted = Avx.ConvertToVector256Double(four) * Vector256.Create(1 - wx, wx, 1 - wx, wx);
            var sums = Avx.HorizontalAdd(weighted, weighted);
            return (1 - wy) * sums.GetElement(0) + wy * sums.GetElement(2);
        }
        return (1 - wy) * ((1 - wx) * p + wx * Unsafe.Add(ref p, 1)) + wy * ((1 - wx) * q + wx * Unsafe.Add(ref q, 1));
    }

    /// <summary>Bilinear in the four neighbours when all are finite, else the nearest pixel; (u, v) 0-based and held by the chip.</summary>
    [MethodImpl(MethodImplOptions.NoInlining)]
    private static float Sample(PlacedChip chip, ChipRect rect, double u, double v, int width, int height)
    {
        int i = (int)Math.Floor(u), j = (int)Math.Floor(v);
        if (i >= 0 && i < width - 1 && j >= 0 && j < height - 1)
        {
            float a, b, c, d;
            if (i >= rect.X0 && i + 1 <= rect.X1 && j >= rect.Y0 && j + 1 <= rect.Y1)
            {
                var at = (j - rect.Y0) * rect.Width + (i - rect.X0);
                a = rect.Values[at]; b = rect.Values[at + 1];
                c = rect.Values[at + rect.Width]; d = rect.Values[at + rect.Width + 1];
            }
            else
            {
                // Only after an exact-chain fallback can a pixel fall outside the rectangle read.
                a = (float)chip.Plane.ReadValue(i, j); b = (float)chip.Plane.ReadValue(i + 1, j);
                c = (float)chip.Plane.ReadValue(i, j + 1); d = (float)chip.Plane.ReadValue(i + 1, j + 1);
            }
            if (float.IsFinite(a) && float.IsFinite(b) && float.IsFinite(c) && float.IsFinite(d))
            {
                double fx = u - i, fy = v - j;
                return (float)((1 - fx) * (1 - fy) * a + fx * (1 - fy) * b + (1 - fx) * fy * c + fx * fy * d);
            }
        }
        int ni = Math.Clamp((int)Math.Floor(u + 0.5), 0, width - 1), nj = Math.Clamp((int)Math.Floor(v + 0.5), 0, height - 1);
        return ni >= rect.X0 && ni <= rect.X1 && nj >= rect.Y0 && nj <= rect.Y1
            ? rect.Values[(nj - rect.Y0) * rect.Width + (ni - rect.X0)]
            : (float)chip.Plane.ReadValue(ni, nj);
    }
}
