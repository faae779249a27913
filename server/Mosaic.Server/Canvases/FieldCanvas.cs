using Mosaic.Canvas;
using Mosaic.Server.Fields;

namespace Mosaic.Server.Canvases;

/// <summary>
/// The whole-field canvas of one band: the field's common plan, this band's chips placed on it, the virtual
/// <c>CANVAS</c> HDU that tiles, renders, statistics and /sky use like any other, and the chips left off.
/// </summary>
public sealed class FieldCanvas
{
    public const string HduName = "CANVAS";

    private readonly Dictionary<int, FieldHdu> _chipsByIndex;

    internal FieldCanvas(FieldBand band, CanvasPlan plan, CanvasBand canvas, FieldHdu hdu, IReadOnlyList<ExcludedChip> excluded)
    {
        Band = band;
        Plan = plan;
        Canvas = canvas;
        Hdu = hdu;
        Excluded = excluded;
        _chipsByIndex = band.Hdus.ToDictionary(h => h.Index);
    }

    public FieldBand Band { get; }

    public CanvasPlan Plan { get; }

    public CanvasBand Canvas { get; }

    /// <summary>The virtual HDU (index -1, EXTNAME CANVAS) whose plane is the resampled canvas.</summary>
    public FieldHdu Hdu { get; }

    public IReadOnlyList<ExcludedChip> Excluded { get; }

    public int Width => Hdu.Plane.Width;

    public int Height => Hdu.Plane.Height;

    /// <summary>
    /// The original chip holding a canvas point (1-based) and the exact 1-based chip position, by the canvas's own
    /// WCS chain; false in a gap or off the field.
    /// </summary>
    public bool TryLocate(double canvasX, double canvasY, out FieldHdu? chip, out double chipX, out double chipY)
    {
        chip = null;
        if (!Canvas.TryLocate(canvasX, canvasY, out var placed, out chipX, out chipY) || placed is null) return false;
        chip = _chipsByIndex.GetValueOrDefault(placed.HduIndex);
        return chip is not null;
    }
}
