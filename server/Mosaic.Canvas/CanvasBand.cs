using System.Diagnostics.CodeAnalysis;
using Mosaic.Canvas.Geometry;
using Mosaic.Canvas.Mapping;
using Mosaic.Fits;

namespace Mosaic.Canvas;

/// <summary>
/// The chips of one band placed on a <see cref="CanvasPlan"/>, and the band resampled onto the canvas as an
/// <see cref="ImagePlane"/>.
/// <para>Overlap rule: where chips overlap, a canvas pixel belongs to the chip whose centre (on the canvas) is
/// nearest to it, the earlier chip in the list on an exact tie; the owner's value is taken even when it is NaN.
/// A chip holds a chip position (x, y) when 0.5 ≤ x &lt; W + 0.5 and 0.5 ≤ y &lt; H + 0.5 (1-based).</para>
/// </summary>
public sealed class CanvasBand
{
    /// <summary>Chip pixels between outline vertices.</summary>
    public const int OutlineStep = 64;

    /// <summary>Chip edges are sampled this often when finding the canvas rows and columns a chip covers.</summary>
    private const int CoverStep = 8;

    /// <summary>Pixels added around a chip's sampled outline box, for edge curvature between samples.</summary>
    private const int CoverPad = 2;

    private readonly Lazy<ImagePlane> _plane;

    /// <exception cref="ArgumentException">No chips are given.</exception>
    /// <exception cref="CanvasPlanException">A chip's edge has no position on the canvas.</exception>
    public CanvasBand(CanvasPlan plan, IReadOnlyList<CanvasChip> chips)
    {
        ArgumentNullException.ThrowIfNull(plan);
        ArgumentNullException.ThrowIfNull(chips);
        if (chips.Count == 0) throw new ArgumentException("a band needs at least one chip", nameof(chips));
        Plan = plan;
        var placed = new PlacedChip[chips.Count];
        for (var i = 0; i < chips.Count; i++)
        {
            ArgumentNullException.ThrowIfNull(chips[i], nameof(chips));
            placed[i] = Place(plan, i, chips[i]);
        }
        Chips = placed;
        Overlapping = HasOverlaps(placed);
        _plane = new Lazy<ImagePlane>(() => new CanvasPlane(this), LazyThreadSafetyMode.ExecutionAndPublication);
    }

    public CanvasPlan Plan { get; }

    public IReadOnlyList<PlacedChip> Chips { get; }

    /// <summary>
    /// The band resampled onto the canvas: Width and Height of the plan, BITPIX -32, HDU index -1, the first chip's
    /// file. See <see cref="CanvasPlane"/> for the method.
    /// </summary>
    public ImagePlane Plane => _plane.Value;

    /// <summary>Some chips' canvas boxes overlap, so the overlap rule has to be applied.</summary>
    internal bool Overlapping { get; }

    /// <summary>
    /// The chip holding 1-based canvas position (x, y) by the exact WCS chain (canvas pixel → sky → chip pixel, SIP
    /// inverse included), chosen by the overlap rule, and the 1-based chip position there; false in chip gaps and
    /// off the field.
    /// </summary>
    public bool TryLocate(double canvasX, double canvasY, [NotNullWhen(true)] out PlacedChip? chip, out double chipX, out double chipY)
    {
        chip = null;
        chipX = chipY = double.NaN;
        if (!double.IsFinite(canvasX) || !double.IsFinite(canvasY)) return false;
        var best = double.PositiveInfinity;
        foreach (var candidate in Chips)
        {
            var box = candidate.Bounds;
            if (!new CanvasBox(box.MinX - CoverPad, box.MinY - CoverPad, box.MaxX + CoverPad, box.MaxY + CoverPad).Contains(canvasX, canvasY)) continue;
            if (!candidate.Grid.Chain.TryCanvasToChip(canvasX, canvasY, out var x, out var y) || !candidate.Holds(x, y)) continue;
            double dx = canvasX - candidate.Centre.X, dy = canvasY - candidate.Centre.Y;
            var distance = dx * dx + dy * dy;
            if (distance >= best) continue;
            best = distance;
            chip = candidate;
            chipX = x;
            chipY = y;
        }
        return chip is not null;
    }

    private static PlacedChip Place(CanvasPlan plan, int index, CanvasChip chip)
    {
        int width = chip.Plane.Width, height = chip.Plane.Height;
        var link = new FrameLink(chip.Wcs.Frame, plan.Frame);
        CanvasPoint ToCanvas(double x, double y)
        {
            if (!chip.Wcs.TryPixelToSky(x, y, out var lon, out var lat))
                throw new CanvasPlanException($"chip {chip.Name}: its WCS gives no sky position at pixel ({x}, {y})");
            (lon, lat) = link.Apply(lon, lat);
            if (!plan.Wcs.TrySkyToPixel(lon, lat, out var cx, out var cy))
                throw new CanvasPlanException($"chip {chip.Name}: pixel ({x}, {y}) has no position on the field's canvas");
            return new CanvasPoint(cx, cy);
        }

        var outline = ChipEdge.Points(width, height, OutlineStep).Select(p => ToCanvas(p.X, p.Y)).ToArray();
        var bounds = new CanvasBox(outline.Min(p => p.X), outline.Min(p => p.Y), outline.Max(p => p.X), outline.Max(p => p.Y));
        var cover = ChipEdge.Points(width, height, CoverStep).Select(p => ToCanvas(p.X, p.Y)).ToArray();
        // 1-based canvas pixel X covers [X - 0.5, X + 0.5); 0-based column = X - 1.
        // A chip off the canvas ends up with first > last: empty.
        var firstColumn = (int)Math.Max(0, Math.Floor(cover.Min(p => p.X) + 0.5) - 1 - CoverPad);
        var lastColumn = (int)Math.Min(plan.Width - 1, Math.Floor(cover.Max(p => p.X) + 0.5) - 1 + CoverPad);
        var firstRow = (int)Math.Max(0, Math.Floor(cover.Min(p => p.Y) + 0.5) - 1 - CoverPad);
        var lastRow = (int)Math.Min(plan.Height - 1, Math.Floor(cover.Max(p => p.Y) + 0.5) - 1 + CoverPad);
        var (mx, my) = ChipEdge.Centre(width, height);
        var centre = ToCanvas(mx, my);

        var grid = ChipGrid.For(new ExactChain(plan.Wcs, chip.Wcs), firstColumn, lastColumn, firstRow, lastRow);
        return new PlacedChip(index, chip, outline, bounds, centre, grid, firstColumn, lastColumn, firstRow, lastRow);
    }

    private static bool HasOverlaps(PlacedChip[] chips)
    {
        for (var a = 0; a < chips.Length; a++)
            for (var b = a + 1; b < chips.Length; b++)
                if (chips[a].FirstColumn <= chips[b].LastColumn && chips[b].FirstColumn <= chips[a].LastColumn
                    && chips[a].FirstRow <= chips[b].LastRow && chips[b].FirstRow <= chips[a].LastRow)
                    return true;
        return false;
    }
}
