using Mosaic.Fits;
using Mosaic.Imaging.Pyramids;
using Mosaic.Server.Sky;

namespace Mosaic.Server.Fields;

/// <summary>
/// One image HDU of a band: a chip of a camera frame, the single image of a file, or the band's whole-field canvas
/// (a virtual HDU, index -1, whose header is the synthetic canvas WCS and whose plane resamples the chips).
/// </summary>
public sealed class FieldHdu
{
    private readonly string? _canvasFingerprint;

    public FieldHdu(FieldBand band, Hdu hdu, ImagePlane plane) : this(band, hdu, plane, canvasFingerprint: null)
    {
    }

    /// <param name="canvasFingerprint">The canvas plan's hash for the virtual canvas HDU; null for an HDU of the file.</param>
    internal FieldHdu(FieldBand band, Hdu hdu, ImagePlane plane, string? canvasFingerprint)
    {
        ArgumentNullException.ThrowIfNull(band);
        ArgumentNullException.ThrowIfNull(hdu);
        ArgumentNullException.ThrowIfNull(plane);
        Band = band;
        Index = hdu.Index;
        Name = hdu.ExtName is { Length: > 0 } name ? name : hdu.Index == 0 ? "PRIMARY" : $"HDU {hdu.Index}";
        Hdu = hdu;
        Plane = plane;
        Geometry = new PyramidGeometry(plane.Width, plane.Height);
        Sky = ImageSky.Read(hdu.Header, plane.Width, plane.Height);
        Unit = hdu.Header.GetString("BUNIT")?.Trim() is { Length: > 0 } unit ? unit : null;
        _canvasFingerprint = canvasFingerprint;
    }

    public FieldBand Band { get; }

    public int Index { get; }

    /// <summary>EXTNAME where present, else "PRIMARY" or "HDU n"; "CANVAS" for the canvas.</summary>
    public string Name { get; }

    public Hdu Hdu { get; }

    public ImagePlane Plane { get; }

    public PyramidGeometry Geometry { get; }

    /// <summary>The celestial WCS, or why there is none; read once, with the HDU.</summary>
    public ImageSky Sky { get; }

    public string? Unit { get; }

    /// <summary>True for the band's virtual whole-field canvas.</summary>
    public bool IsCanvas => _canvasFingerprint is not null;

    /// <summary>
    /// Identifies this HDU's pixels: changes whenever the file does. The canvas's also carries the plan's hash, since
    /// its grid depends on every band of the field.
    /// </summary>
    public string PyramidKey => _canvasFingerprint is { } plan ? $"{Band.Version}-canvas-{plan}" : $"{Band.Version}-{Index}";

    public string Description => $"{Band.Field.Id}/{Band.Name}/{Name}";
}
