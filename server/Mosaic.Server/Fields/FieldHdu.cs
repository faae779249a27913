using Mosaic.Fits;
using Mosaic.Imaging.Pyramids;
using Mosaic.Server.Sky;

namespace Mosaic.Server.Fields;

/// <summary>One image HDU of a band: a chip of a camera frame, or the single image of a file.</summary>
public sealed class FieldHdu(FieldBand band, Hdu hdu, ImagePlane plane)
{
    public FieldBand Band { get; } = band;

    public int Index { get; } = hdu.Index;

    /// <summary>EXTNAME where present, else "PRIMARY" or "HDU n".</summary>
    public string Name { get; } = hdu.ExtName is { Length: > 0 } name ? name : hdu.Index == 0 ? "PRIMARY" : $"HDU {hdu.Index}";

    public Hdu Hdu { get; } = hdu;

    public ImagePlane Plane { get; } = plane;

    public PyramidGeometry Geometry { get; } = new(plane.Width, plane.Height);

    /// <summary>The celestial WCS, or why there is none; read once, with the HDU.</summary>
    public ImageSky Sky { get; } = ImageSky.Read(hdu.Header, plane.Width, plane.Height);

    public string? Unit { get; } = hdu.Header.GetString("BUNIT")?.Trim() is { Length: > 0 } unit ? unit : null;

    /// <summary>Identifies this HDU's pixels: changes whenever the file does.</summary>
    public string PyramidKey => $"{Band.Version}-{Index}";

    public string Description => $"{Band.Field.Id}/{Band.Name}/{Name}";
}
