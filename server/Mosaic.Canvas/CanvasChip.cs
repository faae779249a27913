using Mosaic.Fits;

namespace Mosaic.Canvas;

/// <summary>
/// One chip of a band as the canvas reads it. A chip without a usable celestial WCS cannot be one: the caller leaves
/// it off the canvas (and says why).
/// </summary>
public sealed record CanvasChip
{
    /// <exception cref="ArgumentException">The name is empty, or the plane or WCS is missing.</exception>
    public CanvasChip(string name, int hduIndex, ImagePlane plane, Wcs.Wcs wcs)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        ArgumentOutOfRangeException.ThrowIfNegative(hduIndex);
        ArgumentNullException.ThrowIfNull(plane);
        ArgumentNullException.ThrowIfNull(wcs);
        Name = name; HduIndex = hduIndex; Plane = plane; Wcs = wcs;
    }

    public string Name { get; }

    /// <summary>Index of the chip's HDU in its file (0 = primary).</summary>
    public int HduIndex { get; }

    public ImagePlane Plane { get; }

    public Wcs.Wcs Wcs { get; }

    /// <summary>This chip as the plan sees it.</summary>
    public ChipFootprint Footprint => new(Name, Plane.Width, Plane.Height, Wcs);
}
