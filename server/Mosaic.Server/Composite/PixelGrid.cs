using Mosaic.Fits;
using Mosaic.Server.Fields;

namespace Mosaic.Server.Composite;

/// <summary>
/// An HDU's pixel grid as far as composing bands needs it: NAXIS1 x NAXIS2 and, where the header has a celestial
/// WCS (CTYPE1 and CTYPE2), CRPIX, CRVAL and the linear matrix (CDi_j, else PCi_j × CDELTi, FITS WCS Paper I).
/// </summary>
public sealed record PixelGrid(int Width, int Height, LinearWcs? Wcs)
{
    /// <summary>Relative tolerance of the contract: grids written by one pipeline agree far closer, rounding aside.</summary>
    public const double Tolerance = 1e-9;

    public static PixelGrid Of(FieldHdu hdu)
    {
        ArgumentNullException.ThrowIfNull(hdu);
        return new PixelGrid(hdu.Plane.Width, hdu.Plane.Height, LinearWcs.From(hdu.Hdu.Header));
    }

    /// <summary>
    /// Null where both grids are one, else what differs. The WCS counts only with <paramref name="compareFrames"/>
    /// (the composite sets it where all three bands have one) and where both have one.
    /// </summary>
    public string? DifferenceFrom(PixelGrid other, bool compareFrames = true)
    {
        ArgumentNullException.ThrowIfNull(other);
        if (Width != other.Width || Height != other.Height) return $"{Width} x {Height} pixels against {other.Width} x {other.Height}";
        if (!compareFrames || Wcs is null || other.Wcs is null) return null;
        return Wcs.DifferenceFrom(other.Wcs, Tolerance);
    }
}
