using System.Diagnostics.CodeAnalysis;
using Mosaic.Wcs.Coordinates;
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
    private readonly TpvDistortion? _tpv;

    /// <param name="sip">Required exactly when CTYPE1 ends in "-SIP".</param>
    /// <param name="tpv">Required exactly when the projection code is "TPV".</param>
    public Wcs(WcsHeader header, SipDistortion? sip = null, TpvDistortion? tpv = null)
    {
        ArgumentNullException.ThrowIfNull(header);
        if ((header.Suffix == "-SIP") != (sip is not null))
            throw new ArgumentException(sip is null ? "a -SIP header needs its SIP terms" : "SIP terms given for a header without -SIP", nameof(sip));
        if ((header.ProjectionCode == "TPV") != (tpv is not null))
            throw new ArgumentException(tpv is null ? "a TPV header needs its TPV terms" : "TPV terms given for a header that is not TPV", nameof(tpv));
        Header = header;
        _sip = sip;
        _tpv = tpv;
        _linear = new LinearTransform(header);
        _projection = ProjectionFactory.Create(header);
        // Paper II section 2.5 lets PV{lon}_1/2 move the fiducial point off the projection's own; not supported.
        if (header.FiducialPhi is { } phi0 && phi0 != _projection.Phi0)
            throw new NotSupportedException($"PV{header.LongitudeAxis}_1 = {phi0}: a fiducial point away from the {header.ProjectionCode} projection's own is not supported");
        if (header.FiducialTheta is { } theta0 && theta0 != _projection.Theta0)
            throw new NotSupportedException($"PV{header.LongitudeAxis}_2 = {theta0}: a fiducial point away from the {header.ProjectionCode} projection's own is not supported");
        _rotation = CelestialRotation.From(header, _projection);
        Frame = CelestialFrame.From(header);
    }

    /// <exception cref="WcsHeaderException">The celestial WCS is missing or malformed.</exception>
    /// <exception cref="NotSupportedException">The projection or distortion is not supported.</exception>
    public static Wcs From(FitsHeader header)
    {
        var wcs = WcsHeader.From(header);
        // TPV is written for RA on axis 1; with the latitude first, readers disagree on which polynomial is which.
        if (wcs.ProjectionCode == "TPV" && wcs.LongitudeAxis != 1)
            throw new NotSupportedException($"CTYPE1 '{header.GetString("CTYPE1")?.TrimEnd()}': TPV with the latitude axis first is not supported");
        return new Wcs(wcs,
            wcs.Suffix == "-SIP" ? SipDistortion.From(header) : null,
            wcs.ProjectionCode == "TPV" ? TpvDistortion.From(header, wcs.CDelt1, wcs.CDelt2, wcs.LongitudeAxis, wcs.LatitudeAxis) : null);
    }

    public WcsHeader Header { get; }

    /// <summary>The frame the header's sky axes are written in; <see cref="TryPixelToSky"/> answers in it.</summary>
    public CelestialFrame Frame { get; }

    /// <summary>The three-letter projection code, e.g. "TAN".</summary>
    public string ProjectionCode => Header.ProjectionCode == "TPV" ? "TAN" : Header.ProjectionCode;

    /// <summary>"SIP" or "TPV" when a distortion applies, else null.</summary>
    public string? DistortionName => _sip is not null ? "SIP" : _tpv is not null ? "TPV" : null;

    /// <summary>ICRS position of 1-based pixel (x, y); false (and null) where the pixel has no sky position.</summary>
    public bool TryPixelToIcrs(double x, double y, [NotNullWhen(true)] out SkyPosition? icrs)
    {
        icrs = TryPixelToSky(x, y, out var lon, out var lat) ? Frame.ToIcrs(lon, lat) : null;
        return icrs is not null;
    }

    /// <summary>1-based pixel of an ICRS position; false where the position has no image.</summary>
    public bool TryIcrsToPixel(SkyPosition icrs, out double x, out double y)
    {
        ArgumentNullException.ThrowIfNull(icrs);
        var (lon, lat) = Frame.FromIcrs(icrs);
        return TrySkyToPixel(lon, lat, out x, out y);
    }

    /// <summary>Sky position in the header's own <see cref="Frame"/> of 1-based pixel (x, y); false where the pixel lies outside the projection's domain.</summary>
    public bool TryPixelToSky(double x, double y, out double ra, out double dec)
    {
        double dx = x - _linear.CrPix1, dy = y - _linear.CrPix2;
        if (_sip is not null) (dx, dy) = _sip.Forward(dx, dy);
        var (ix, iy) = _linear.OffsetToIntermediate(dx, dy);
        if (_tpv is not null) (ix, iy) = _tpv.Forward(ix, iy);
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
        if (_tpv is not null && !_tpv.TryInverse(ix, iy, out ix, out iy)) return false;
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
