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

    /// <param name="index">How the band addresses the chip: the FITS HDU index in a band of one file, else 0..n-1 over the band.</param>
    /// <param name="name">The chip's name in the band (see <see cref="FieldNaming.ChipName"/>).</param>
    /// <param name="file">The file holding the HDU; null for the virtual canvas.</param>
    /// <param name="canvasFingerprint">The canvas plan's hash for the virtual canvas HDU; null for an HDU of a file.</param>
    internal FieldHdu(FieldBand band, Hdu hdu, ImagePlane plane, int index, string name, FieldFile? file, string? canvasFingerprint)
    {
        ArgumentNullException.ThrowIfNull(band);
        ArgumentNullException.ThrowIfNull(hdu);
        ArgumentNullException.ThrowIfNull(plane);
        Band = band;
        Index = index;
        Name = name;
        File = file;
        Hdu = hdu;
        Plane = plane;
        Geometry = new PyramidGeometry(plane.Width, plane.Height);
        Sky = ImageSky.Read(hdu.Header, plane.Width, plane.Height);
        Unit = hdu.Header.GetString("BUNIT")?.Trim() is { Length: > 0 } unit ? unit : null;
        _canvasFingerprint = canvasFingerprint;
    }

    public FieldBand Band { get; }

    /// <summary>The chip's address in its band: the FITS HDU index where the band is one file, else its place 0..n-1 in the band; -1 for the canvas.</summary>
    public int Index { get; }

    /// <summary>The HDU's number inside its file (0 = primary); -1 for the canvas.</summary>
    public int FitsIndex => Hdu.Index;

    /// <summary>EXTNAME where present, else "PRIMARY" or "HDU n" (a band of several files: see <see cref="FieldNaming.ChipName"/>); "CANVAS" for the canvas.</summary>
    public string Name { get; }

    /// <summary>The file holding this HDU; null for the virtual canvas.</summary>
    public FieldFile? File { get; }

    public Hdu Hdu { get; }

    public ImagePlane Plane { get; }

    public PyramidGeometry Geometry { get; }

    /// <summary>The celestial WCS, or why there is none; read once, with the HDU.</summary>
    public ImageSky Sky { get; }

    public string? Unit { get; }

    /// <summary>True for the band's virtual whole-field canvas.</summary>
    public bool IsCanvas => _canvasFingerprint is not null;

    /// <summary>
    /// Identifies this HDU's pixels: its own file's version and HDU number, so it changes with that file only and an
    /// unchanged file keeps its pyramids. The canvas's carries the band's version and the plan's hash, since its grid
    /// depends on every band of the field.
    /// </summary>
    public string PyramidKey => _canvasFingerprint is { } plan ? $"{Band.Version}-canvas-{plan}" : $"{File!.Version}-{FitsIndex}";

    public string Description => $"{Band.Field.Id}/{Band.Name}/{Name}";
}
