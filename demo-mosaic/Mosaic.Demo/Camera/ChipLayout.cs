using Mosaic.Demo.Defects;
using Mosaic.Demo.Wcs;

namespace Mosaic.Demo.Camera;

/// <summary>
/// One chip of the camera: where it sits on the focal plane, its electronics and its own WCS. Chips are numbered
/// row by row from the south-east corner of the array (the lowest row, smallest x first).
/// </summary>
public sealed class ChipLayout
{
    private readonly ChipPlacement _placement;

    internal ChipLayout(int index, int column, int row, ChipPlacement placement, double gain, double readNoiseElectrons,
        long saturateAdu, ChipDefects defects, TanSipWcs wcs, double inverseSipResidualPixels)
    {
        Index = index;
        Column = column;
        Row = row;
        _placement = placement;
        Gain = gain;
        ReadNoiseElectrons = readNoiseElectrons;
        SaturateAdu = saturateAdu;
        Defects = defects;
        Wcs = wcs;
        InverseSipResidualPixels = inverseSipResidualPixels;
    }

    /// <summary>0-based position in the file: the HDU index is Index + 1.</summary>
    public int Index { get; }

    public string ExtName => $"CHIP{Index + 1:D2}";

    /// <summary>0-based column of the chip grid, in pixel x order (east to west, as east is left).</summary>
    public int Column { get; }

    /// <summary>0-based row of the chip grid, in pixel y order (south to north).</summary>
    public int Row { get; }

    public int Width => _placement.Width;

    public int Height => _placement.Height;

    /// <summary>Centre of the chip on the undistorted focal plane, in pixels from the boresight.</summary>
    public double FocalCentreX => _placement.CentreX;

    public double FocalCentreY => _placement.CentreY;

    /// <summary>Rotation of the chip's pixel axes against the focal plane (mounting error), counter-clockwise.</summary>
    public double RotationDegrees => _placement.RotationDegrees;

    /// <summary>Electrons per ADU.</summary>
    public double Gain { get; }

    public double ReadNoiseElectrons { get; }

    /// <summary>The SATURATE value: pixels at or above it are stored as NaN.</summary>
    public long SaturateAdu { get; }

    /// <summary>Charge a pixel holds before it bleeds into its column neighbours.</summary>
    public double FullWellElectrons => SaturateAdu * Gain;

    public ChipDefects Defects { get; }

    /// <summary>The TAN-SIP description written into this chip's header.</summary>
    public TanSipWcs Wcs { get; }

    /// <summary>Worst residual of the AP/BP inverse fit over the chip, in pixels.</summary>
    public double InverseSipResidualPixels { get; }

    /// <summary>Whether the pixel lies on the chip, at least margin pixels inside its outer edge when margin &gt; 0.</summary>
    public bool Contains(PixelPosition pixel, double margin = 0) =>
        pixel.X >= -0.5 + margin && pixel.X <= Width - 0.5 - margin &&
        pixel.Y >= -0.5 + margin && pixel.Y <= Height - 0.5 - margin;

    /// <summary>Undistorted focal-plane position (pixels from the boresight) of a chip pixel.</summary>
    internal (double X, double Y) ToFocalPlane(PixelPosition pixel) => _placement.ToFocalPlane(pixel);
}
