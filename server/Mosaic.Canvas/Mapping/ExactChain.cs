using Mosaic.Canvas.Geometry;

namespace Mosaic.Canvas.Mapping;

/// <summary>Canvas pixel → sky → chip pixel through both WCS exactly (the chip's SIP inverse included); 1-based both.</summary>
internal sealed class ExactChain
{
    private readonly Wcs.Wcs _canvas;
    private readonly Wcs.Wcs _chip;
    private readonly FrameLink _toChip;

    public ExactChain(Wcs.Wcs canvas, Wcs.Wcs chip)
    {
        _canvas = canvas;
        _chip = chip;
        _toChip = new FrameLink(canvas.Frame, chip.Frame);
    }

    /// <summary>False (and NaN) where either step has no solution.</summary>
    public bool TryCanvasToChip(double canvasX, double canvasY, out double chipX, out double chipY)
    {
        chipX = chipY = double.NaN;
        if (!_canvas.TryPixelToSky(canvasX, canvasY, out var lon, out var lat)) return false;
        (lon, lat) = _toChip.Apply(lon, lat);
        return _chip.TrySkyToPixel(lon, lat, out chipX, out chipY);
    }
}
