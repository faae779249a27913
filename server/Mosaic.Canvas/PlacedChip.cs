using Mosaic.Canvas.Mapping;
using Mosaic.Fits;

namespace Mosaic.Canvas;

/// <summary>One chip of a band as it lies on the canvas.</summary>
public sealed class PlacedChip
{
    internal PlacedChip(int index, CanvasChip chip, IReadOnlyList<CanvasPoint> outline, CanvasBox bounds, CanvasPoint centre,
        ChipGrid grid, int firstColumn, int lastColumn, int firstRow, int lastRow)
    {
        Index = index;
        Chip = chip;
        Outline = outline;
        Bounds = bounds;
        Centre = centre;
        Grid = grid;
        FirstColumn = firstColumn; LastColumn = lastColumn; FirstRow = firstRow; LastRow = lastRow;
    }

    /// <summary>Position in <see cref="CanvasBand.Chips"/>.</summary>
    public int Index { get; }

    public CanvasChip Chip { get; }

    public string Name => Chip.Name;

    public int HduIndex => Chip.HduIndex;

    public ImagePlane Plane => Chip.Plane;

    public Wcs.Wcs Wcs => Chip.Wcs;

    /// <summary>
    /// The chip's outer edge as a closed polygon in 1-based canvas pixel coordinates (last point = first): from the
    /// chip corner (0.5, 0.5) counter-clockwise in chip pixels along the bottom, right, top and left edges, each edge
    /// in ceil(length / 64) equal steps, so a SIP curvature shows.
    /// </summary>
    public IReadOnlyList<CanvasPoint> Outline { get; }

    /// <summary>The box of the outline, 1-based canvas coordinates (may reach past the canvas for a chip not in the plan).</summary>
    public CanvasBox Bounds { get; }

    /// <summary>Canvas position of the chip's centre pixel ((W + 1) / 2, (H + 1) / 2); the overlap rule measures from it.</summary>
    public CanvasPoint Centre { get; }

    internal ChipGrid Grid { get; }

    /// <summary>0-based canvas columns and rows the chip may cover, inclusive, clipped to the canvas.</summary>
    internal int FirstColumn { get; }
    internal int LastColumn { get; }
    internal int FirstRow { get; }
    internal int LastRow { get; }

    internal bool IsEmpty => FirstColumn > LastColumn || FirstRow > LastRow;

    /// <summary>The chip holds 1-based chip position (x, y): it lies within the outer pixel edges.</summary>
    internal bool Holds(double x, double y) => x >= 0.5 && x < Chip.Plane.Width + 0.5 && y >= 0.5 && y < Chip.Plane.Height + 0.5;
}
