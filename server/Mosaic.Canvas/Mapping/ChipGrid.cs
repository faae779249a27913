using System.Collections.Concurrent;

namespace Mosaic.Canvas.Mapping;

/// <summary>
/// The chip position of canvas pixels on a coarse grid: nodes at canvas pixels (1 + i G, 1 + j G) (1-based) over the
/// chip's canvas box, each found by the exact chain; positions between are bilinear in the four nodes around. G starts
/// at 64 canvas pixels and is halved (down to 2) while the error measured at cell centres across the chip exceeds
/// <see cref="TargetError"/>: a mild distortion gets few nodes (the exact chain costs microseconds), a strong one more
/// nodes rather than less accuracy. Node rows are computed when first needed and kept in a cache bounded to
/// <see cref="CachedNodes"/> nodes, so a gigapixel canvas never holds its whole grid. Thread-safe.
/// </summary>
internal sealed class ChipGrid
{
    /// <summary>Canvas pixels between grid nodes, at most.</summary>
    public const int CoarsestSpacing = 64;

    /// <summary>Largest interpolation error accepted at the sampled cell centres, chip pixels.</summary>
    public const double TargetError = 0.002;

    /// <summary>Cells sampled along each axis of the chip's box when choosing the spacing.</summary>
    private const int Probes = 12;

    /// <summary>Nodes kept per chip (8 MiB): the whole grid of any usual chip, a band of rows of a huge one.</summary>
    private const int CachedNodes = 1 << 19;

    private readonly ExactChain _chain;
    private readonly ConcurrentDictionary<int, double[]> _rows = new();

    /// <param name="spacing">G, canvas pixels between nodes.</param>
    /// <param name="firstColumn">First node column i (canvas X = 1 + i G).</param>
    /// <param name="columnCount">Node columns held.</param>
    private ChipGrid(ExactChain chain, int spacing, int firstColumn, int columnCount)
    {
        _chain = chain;
        Spacing = spacing;
        FirstColumn = firstColumn;
        ColumnCount = columnCount;
    }

    /// <summary>A grid for 0-based canvas columns [firstColumn, lastColumn] and rows [firstRow, lastRow], its spacing chosen by measurement.</summary>
    public static ChipGrid For(ExactChain chain, int firstColumn, int lastColumn, int firstRow, int lastRow)
    {
        for (var spacing = CoarsestSpacing; ; spacing /= 2)
        {
            // Column c (0-based) lies in the cell of nodes c / G and c / G + 1.
            var firstNode = Math.Max(0, firstColumn) / spacing;
            var lastNode = Math.Max(firstNode * spacing, lastColumn) / spacing + 1;
            var grid = new ChipGrid(chain, spacing, firstNode, lastNode - firstNode + 1);
            if (spacing == 2 || grid.MeasuredError(firstColumn, lastColumn, firstRow, lastRow) <= TargetError) return grid;
        }
    }

    public int Spacing { get; }

    public int FirstColumn { get; }

    public int ColumnCount { get; }

    /// <summary>Node row j: chip (x, y) interleaved for node columns FirstColumn.., NaN where the chain fails.</summary>
    public double[] Row(int j)
    {
        if (_rows.TryGetValue(j, out var row)) return row;
        row = new double[2 * ColumnCount];
        double canvasY = 1 + (double)j * Spacing;
        for (var k = 0; k < ColumnCount; k++)
        {
            _chain.TryCanvasToChip(1 + (double)(FirstColumn + k) * Spacing, canvasY, out var x, out var y);
            row[2 * k] = x;
            row[2 * k + 1] = y;
        }
        // Bounded: when full, drop everything; strips move on monotonically, so little is lost.
        if (_rows.Count >= Math.Max(8, CachedNodes / ColumnCount)) _rows.Clear();
        return _rows.GetOrAdd(j, row);
    }

    /// <summary>The interpolated chip position of canvas pixel (x, y), 1-based; for tests and probes of the grid itself.</summary>
    public (double X, double Y) Interpolate(double canvasX, double canvasY)
    {
        double gx = (canvasX - 1) / Spacing, gy = (canvasY - 1) / Spacing;
        int i = (int)Math.Floor(gx), j = (int)Math.Floor(gy);
        double fx = gx - i, fy = gy - j;
        var k = i - FirstColumn;
        if (k < 0 || k + 1 >= ColumnCount) return (double.NaN, double.NaN);
        double[] r0 = Row(j), r1 = Row(j + 1);
        double Lerp2(int c) =>
            (1 - fy) * ((1 - fx) * r0[2 * k + c] + fx * r0[2 * k + 2 + c]) + fy * ((1 - fx) * r1[2 * k + c] + fx * r1[2 * k + 2 + c]);
        return (Lerp2(0), Lerp2(1));
    }

    public ExactChain Chain => _chain;

    /// <summary>The largest difference between interpolated and exact positions at cell centres sampled over the box (bilinear errs most there).</summary>
    private double MeasuredError(int firstColumn, int lastColumn, int firstRow, int lastRow)
    {
        double worst = 0;
        for (var a = 0; a < Probes; a++)
            for (var b = 0; b < Probes; b++)
            {
                // A cell (0-based canvas pixel spread over the box, rounded down to its cell), its corners and its centre.
                long c = firstColumn + (long)(lastColumn - firstColumn) * a / (Probes - 1);
                long r = firstRow + (long)(lastRow - firstRow) * b / (Probes - 1);
                double x0 = 1 + c / Spacing * Spacing, y0 = 1 + r / Spacing * Spacing;
                if (!_chain.TryCanvasToChip(x0 + Spacing / 2.0, y0 + Spacing / 2.0, out var ex, out var ey)) continue;
                if (!_chain.TryCanvasToChip(x0, y0, out var ax, out var ay) || !_chain.TryCanvasToChip(x0 + Spacing, y0, out var bx, out var by)
                    || !_chain.TryCanvasToChip(x0, y0 + Spacing, out var cx, out var cy) || !_chain.TryCanvasToChip(x0 + Spacing, y0 + Spacing, out var dx, out var dy))
                    continue;
                double ix = (ax + bx + cx + dx) / 4, iy = (ay + by + cy + dy) / 4;
                worst = Math.Max(worst, Math.Max(Math.Abs(ix - ex), Math.Abs(iy - ey)));
            }
        return worst;
    }
}
