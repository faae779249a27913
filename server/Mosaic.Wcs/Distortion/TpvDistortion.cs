using Mosaic.Wcs.Header;
using FitsHeader = Mosaic.Fits.Header;

namespace Mosaic.Wcs.Distortion;

/// <summary>
/// The TPV distortion ('RA---TPV' / 'DEC--TPV'): intermediate world coordinates (x, y) in degrees become
/// xi = P1(x, y) and eta = P2(y, x) before the gnomonic projection, P1 from PV1_m and P2 from PV2_m (each
/// polynomial takes its own axis first). The inverse is Newton's method on the forward polynomials to 1e-12 deg.
/// With the CDELT/PC form the polynomials act on PC (p - r) and CDELT scales their result, as wcslib reads TPV
/// (the convention itself is written for a CD matrix, where both readings agree).
/// </summary>
public sealed class TpvDistortion
{
    private const double Tolerance = 1e-12;
    private const int MaxIterations = 60;
    private readonly TpvPolynomial _lon, _lat;
    private readonly double _s1 = 1, _s2 = 1;

    /// <param name="longitude">The polynomial of the longitude axis (its own coordinate x first).</param>
    /// <param name="latitude">The polynomial of the latitude axis (its own coordinate y first).</param>
    /// <exception cref="WcsHeaderException">The linear terms leave the distortion singular at the reference point.</exception>
    public TpvDistortion(TpvPolynomial longitude, TpvPolynomial latitude, int longitudeAxis = 1, int latitudeAxis = 2)
    {
        _lon = longitude ?? throw new ArgumentNullException(nameof(longitude));
        _lat = latitude ?? throw new ArgumentNullException(nameof(latitude));
        // The r terms add no slope at the origin, so the Jacobian there is the linear terms alone.
        if (_lon[1] * _lat[1] - _lon[2] * _lat[2] == 0)
            throw new WcsHeaderException($"PV{longitudeAxis}_1",
                $"the TPV linear terms (PV{longitudeAxis}_1, PV{longitudeAxis}_2, PV{latitudeAxis}_1, PV{latitudeAxis}_2) are singular; TPV has no default for them");
    }

    /// <param name="scale1">CDELT of the longitude axis in degrees (1 for a CD matrix).</param>
    /// <param name="scale2">CDELT of the latitude axis in degrees (1 for a CD matrix).</param>
    public TpvDistortion(TpvPolynomial longitude, TpvPolynomial latitude, double scale1, double scale2, int longitudeAxis = 1, int latitudeAxis = 2)
        : this(longitude, latitude, longitudeAxis, latitudeAxis)
    {
        if (!double.IsFinite(scale1) || scale1 == 0) throw new ArgumentOutOfRangeException(nameof(scale1), scale1, "must be finite and non-zero");
        if (!double.IsFinite(scale2) || scale2 == 0) throw new ArgumentOutOfRangeException(nameof(scale2), scale2, "must be finite and non-zero");
        _s1 = scale1; _s2 = scale2;
    }

    /// <summary>PV{lon}_m and PV{lat}_m of a 'xxxx-TPV' header, with its CDELTs (1 for a CD matrix).</summary>
    public static TpvDistortion From(FitsHeader header, double scale1 = 1, double scale2 = 1, int longitudeAxis = 1, int latitudeAxis = 2) =>
        new(TpvPolynomial.From(header, longitudeAxis), TpvPolynomial.From(header, latitudeAxis), scale1, scale2, longitudeAxis, latitudeAxis);

    /// <summary>Intermediate world (x, y) in degrees to the distorted (xi, eta) the projection takes.</summary>
    public (double Xi, double Eta) Forward(double x, double y)
    {
        double u = x / _s1, v = y / _s2;
        return (_s1 * _lon.Evaluate(u, v).Value, _s2 * _lat.Evaluate(v, u).Value);
    }

    /// <summary>The intermediate (x, y) whose distorted image is (xi, eta); false if Newton's method does not converge.</summary>
    public bool TryInverse(double xi, double eta, out double x, out double y)
    {
        if (!TryInverseScaled(xi / _s1, eta / _s2, out x, out y)) return false;
        x *= _s1; y *= _s2;
        return true;
    }

    private bool TryInverseScaled(double xi, double eta, out double x, out double y)
    {
        // Start from the linear terms alone.
        double a = _lon[1], b = _lon[2], c = _lat[2], d = _lat[1];
        var det = a * d - b * c;
        double rx = xi - _lon[0], ry = eta - _lat[0];
        x = (d * rx - b * ry) / det;
        y = (a * ry - c * rx) / det;
        for (var i = 0; i < MaxIterations; i++)
        {
            var (f, fx, fy) = _lon.Evaluate(x, y);
            var (g, gy, gx) = _lat.Evaluate(y, x);
            double r1 = f - xi, r2 = g - eta;
            var j = fx * gy - fy * gx;
            if (j == 0 || !double.IsFinite(j)) break;
            var dx = (gy * r1 - fy * r2) / j;
            var dy = (fx * r2 - gx * r1) / j;
            x -= dx; y -= dy;
            if (Math.Abs(dx) < Tolerance && Math.Abs(dy) < Tolerance) return double.IsFinite(x) && double.IsFinite(y);
        }
        x = y = double.NaN;
        return false;
    }
}
