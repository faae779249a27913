using Mosaic.Wcs.Distortion;
using Mosaic.Wcs.Header;
using Mosaic.Wcs.Linear;
using Mosaic.Wcs.Projections;
using Mosaic.Wcs.Spherical;
using FitsHeader = Mosaic.Fits.Header;

namespace Mosaic.Wcs;

/// <summary>
/// A celestial world coordinate system: 1-based FITS pixel (x, y) to sky (longitude, latitude) in degrees and back,
/// through the linear step (Paper I), the projection and the spherical rotation (Paper II).
/// </summary>
public sealed class Wcs
{
    private readonly LinearTransform _linear;
    private readonly Projection _projection;
    private readonly CelestialRotation _rotation;
    private readonly SipDistortion? _sip;

    /// <param name="sip">Required exactly when CTYPE1 ends in "-SIP".</param>
    public Wcs(WcsHeader header, SipDistortion? sip = null)
    {
        ArgumentNullException.ThrowIfNull(header);
        if ((header.Suffix == "-SIP") != (sip is not null))
            throw new ArgumentException(sip is null ? "a -SIP header needs its SIP terms" : "SIP terms given for a header without -SIP", nameof(sip));
        Header = header;
        _sip = sip;
        _linear = new LinearTransform(header);
        _projection = ProjectionFactory.Create(header);
        _rotation = CelestialRotation.From(header, _projection);
    }

    /// <exception cref="WcsHeaderException">The celestial WCS is missing or malformed.</exception>
    /// <exception cref="NotSupportedException">The projection or distortion is not supported.</exception>
    public static Wcs From(FitsHeader header)
    {
        var wcs = WcsHeader.From(header);
        return new Wcs(wcs, wcs.Suffix == "-SIP" ? SipDistortion.From(header) : null);
    }

    public WcsHeader Header { get; }

    /// <summary>Sky position of 1-based pixel (x, y); false where the pixel lies outside the projection's domain.</summary>
    public bool TryPixelToSky(double x, double y, out double ra, out double dec)
    {
        double dx = x - _linear.CrPix1, dy = y - _linear.CrPix2;
        if (_sip is not null) (dx, dy) = _sip.Forward(dx, dy);
        var (ix, iy) = _linear.OffsetToIntermediate(dx, dy);
        if (!_projection.TryPlaneToNative(ix, iy, out var phi, out var theta))
        {
            ra = dec = double.NaN;
            return false;
        }
        (ra, dec) = _rotation.NativeToCelestial(phi, theta);
        return true;
    }

    /// <summary>1-based pixel of sky position (ra, dec) in degrees; false where the position has no image.</summary>
    public bool TrySkyToPixel(double ra, double dec, out double x, out double y)
    {
        x = y = double.NaN;
        if (!double.IsFinite(ra) || !(dec is >= -90 and <= 90)) return false;
        var (phi, theta) = _rotation.CelestialToNative(ra, dec);
        if (!_projection.TryNativeToPlane(phi, theta, out var ix, out var iy)) return false;
        var (dx, dy) = _linear.IntermediateToOffset(ix, iy);
        if (_sip is not null && !_sip.TryInverse(dx, dy, out dx, out dy)) return false;
        x = dx + _linear.CrPix1;
        y = dy + _linear.CrPix2;
        return true;
    }

    /// <exception cref="ArgumentOutOfRangeException">The pixel has no sky position.</exception>
    public (double Ra, double Dec) PixelToSky(double x, double y) =>
        TryPixelToSky(x, y, out var ra, out var dec) ? (ra, dec)
            : throw new ArgumentOutOfRangeException(nameof(x), $"pixel ({x}, {y}) lies outside the projection's domain");

    /// <exception cref="ArgumentOutOfRangeException">The sky position has no image.</exception>
    public (double X, double Y) SkyToPixel(double ra, double dec) =>
        TrySkyToPixel(ra, dec, out var x, out var y) ? (x, y)
            : throw new ArgumentOutOfRangeException(nameof(ra), $"sky position ({ra}, {dec}) has no image in this projection");
}
