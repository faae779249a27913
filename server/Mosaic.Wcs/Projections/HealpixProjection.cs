using Mosaic.Wcs.Header;

namespace Mosaic.Wcs.Projections;

/// <summary>
/// HPX, Calabretta &amp; Roukema (2007) section 6 (Paper II's HEALPix addition): H = PV2_1 facets in longitude
/// (default 4), K = PV2_2 in latitude (default 3). Between |sin(theta)| = (K-1)/K the projection is cylindrical
/// equal-area, x = phi, y = (90 K / H) sin(theta); towards the poles each facet's meridians converge on its centre
/// phi_c with sigma = sqrt(K (1 - |sin theta|)): x = phi_c + (phi - phi_c) sigma, y = (180/H) ((K+1)/2 - sigma).
/// For even K the southern polar half-facets are shifted by half a facet. Plane points between the polar triangles
/// have no sky position.
/// </summary>
public sealed class HealpixProjection : Projection
{
    private readonly double _h, _k, _facet, _equatorLimit, _yScale, _yEquator, _yLimit;
    private readonly bool _oddK, _oddH;

    /// <exception cref="WcsHeaderException">H or K is not a positive whole number.</exception>
    public HealpixProjection(double h, double k)
    {
        if (!(h > 0) || h != Math.Round(h)) throw new WcsHeaderException("PV2_1", $"HPX needs a positive whole H, got {h}");
        if (!(k > 0) || k != Math.Round(k)) throw new WcsHeaderException("PV2_2", $"HPX needs a positive whole K, got {k}");
        _h = h; _k = k;
        _facet = 180 / h;                       // half a facet's width in x
        _equatorLimit = (k - 1) / k;            // |sin theta| of the polar boundary
        _yScale = 90 * k / h;
        _yEquator = 90 * (k - 1) / h;
        _yLimit = _facet * (k + 1) / 2;
        _oddK = (int)k % 2 == 1;
        _oddH = (int)h % 2 == 1;
    }

    public override double Theta0 => 0;

    /// <summary>Centre of the facet column holding <paramref name="v"/> (x or phi), for odd K or the north.</summary>
    private double FacetCentre(double v) => -180 + (2 * Math.Floor((v + 180) * _h / 360) + 1) * _facet;

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        if (!double.IsFinite(x) || !double.IsFinite(y)) return false;
        var absY = Math.Abs(y);
        if (absY <= _yEquator)
        {
            phi = x;
            theta = Math.Asin(y / _yScale) * R2D;
            return InNativeRange(ref phi, ref theta, 1e-12);
        }
        if (absY > _yLimit) return false;
        var offset = x - FacetCentre(x);
        // Even K: the southern polar half-facets sit half a facet over.
        if (!_oddK && y <= 0)
        {
            var column = (int)Math.Floor(x / _facet) + (_oddH ? 1 : 0);
            offset += column % 2 != 0 ? -_facet : _facet;
        }
        var sigma = (_k + 1) / 2 - absY / _facet;
        double scale;
        if (sigma == 0) { scale = 1e9; theta = 90; }
        else
        {
            var t = 1 - sigma * sigma / _k;
            if (t < -1) return false;
            scale = 1 / sigma;
            theta = Math.Asin(t) * R2D;
        }
        if (y < 0) theta = -theta;
        var r = scale * offset;
        // Between the polar triangles: farther from the facet centre than half a facet once unfolded.
        if (_facet + 1e-12 <= Math.Abs(r)) { theta = double.NaN; return false; }
        phi = r == 0 ? x : x + (r - offset);
        return InNativeRange(ref phi, ref theta, 1e-12);
    }

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!(phi is >= -180 and <= 180) || !(theta is >= -90 and <= 90)) return false;
        var sinTheta = SinCosDegrees(theta).Sin;
        var absSin = Math.Abs(sinTheta);
        if (absSin <= _equatorLimit)
        {
            x = phi;
            y = _yScale * sinTheta;
            return true;
        }
        var offset = phi - FacetCentre(phi);
        if (!_oddK && theta <= 0)
        {
            var column = (int)Math.Floor(phi / _facet) + (_oddH ? 1 : 0);
            offset += column % 2 != 0 ? -_facet : _facet;
        }
        var sigma = Math.Sqrt(_k * (1 - absSin));
        x = phi + offset * (sigma - 1);
        y = _facet * ((_k + 1) / 2 - sigma);
        if (theta < 0) y = -y;
        // The phi = 180 meridian of the last facet belongs at the left edge.
        if (x > 180) x = 360 - x;
        return true;
    }
}
