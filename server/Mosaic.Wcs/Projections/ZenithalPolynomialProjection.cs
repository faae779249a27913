using Mosaic.Wcs.Header;

namespace Mosaic.Wcs.Projections;

/// <summary>
/// ZPN, Paper II section 5.1.7: R = (180/pi) sum_m PV2_m (90 - theta)^m with the zenith distance in radians
///, m = 0..20. The inverse follows the paper: from the pole out to the first maximum of R (where dR/dtheta
/// first changes sign) R is monotonic and is solved there; beyond that maximum there is no image.
/// </summary>
public sealed class ZenithalPolynomialProjection : ZenithalProjection
{
    /// <summary>Highest coefficient index FITS WCS Paper II allows for ZPN.</summary>
    public const int MaxDegree = 20;

    private const double Tolerance = 1e-13;
    private readonly double[] _p;
    private readonly int _degree;
    private readonly double _limit;       // zenith distance (radians) of the first maximum of R, or pi
    private readonly double _limitRadius; // R there, in radians

    /// <exception cref="WcsHeaderException">The polynomial is constant, or of degree 2 or more with PV2_1 &lt;= 0.</exception>
    public ZenithalPolynomialProjection(IReadOnlyList<double> coefficients)
    {
        ArgumentNullException.ThrowIfNull(coefficients);
        _degree = -1;
        for (var m = 0; m < coefficients.Count; m++)
            if (coefficients[m] != 0) _degree = m;
        if (_degree > MaxDegree) throw new WcsHeaderException($"PV2_{_degree}", $"ZPN takes PV2_0 to PV2_{MaxDegree}");
        if (_degree < 1) throw new WcsHeaderException("PV2_1", "ZPN needs a non-constant polynomial in PV2_0..PV2_20");
        _p = coefficients.Take(_degree + 1).ToArray();
        _limit = Math.PI;
        if (_degree >= 2)
        {
            if (_p[1] <= 0) throw new WcsHeaderException("PV2_1", "ZPN of degree 2 or more needs PV2_1 > 0 (R must grow from the pole)");
            _limit = FirstMaximum();
        }
        _limitRadius = Evaluate(_limit);
    }

    protected override bool TryRadius(double theta, out double r)
    {
        var zd = (90 - theta) * D2R;
        r = double.NaN;
        if (_degree >= 2 && zd > _limit) return false;
        r = R2D * Evaluate(zd);
        return true;
    }

    protected override bool TryTheta(double r, out double theta)
    {
        theta = double.NaN;
        var rr = r * D2R;
        double zd;
        if (_degree == 1)
        {
            zd = (rr - _p[0]) / _p[1];
        }
        else if (_degree == 2)
        {
            // The quadratic's root nearer the pole that is not negative.
            double a = _p[2], b = _p[1], c = _p[0] - rr;
            var d = b * b - 4 * a * c;
            if (d < 0) return false;
            d = Math.Sqrt(d);
            double z1 = (-b + d) / (2 * a), z2 = (-b - d) / (2 * a);
            zd = Math.Min(z1, z2);
            if (zd < -Tolerance) zd = Math.Max(z1, z2);
            if (zd < -Tolerance || zd > Math.PI + Tolerance) return false;
            zd = Math.Clamp(zd, 0, Math.PI);
        }
        else
        {
            if (rr < _p[0] - Tolerance || rr > _limitRadius + Tolerance) return false;
            zd = rr <= _p[0] ? 0 : rr >= _limitRadius ? _limit : Solve(rr);
        }
        theta = 90 - zd * R2D;
        if (!(Math.Abs(theta) <= 90 + Tolerance)) { theta = double.NaN; return false; }
        theta = Math.Clamp(theta, -90, 90);
        return true;
    }

    private double Evaluate(double zd)
    {
        var r = 0.0;
        for (var m = _degree; m >= 0; m--) r = r * zd + _p[m];
        return r;
    }

    private double Derivative(double zd)
    {
        var d = 0.0;
        for (var m = _degree; m > 0; m--) d = d * zd + m * _p[m];
        return d;
    }

    /// <summary>The first zenith distance where dR/dzd reaches zero, found in 1-degree steps then by bisection; pi if none.</summary>
    private double FirstMaximum()
    {
        double lo = 0;
        for (var j = 1; j <= 180; j++)
        {
            var hi = j * D2R;
            if (Derivative(hi) > 0) { lo = hi; continue; }
            for (var k = 0; k < 200 && hi - lo > 1e-16; k++)
            {
                var mid = 0.5 * (lo + hi);
                if (Derivative(mid) > 0) lo = mid; else hi = mid;
            }
            return lo;
        }
        return Math.PI;
    }

    /// <summary>R(zd) = rr on [0, limit], where R rises monotonically: Newton steps kept inside a shrinking bracket.</summary>
    private double Solve(double rr)
    {
        double lo = 0, hi = _limit;
        var zd = (rr - _p[0]) / (_limitRadius - _p[0]) * _limit;
        for (var k = 0; k < 200; k++)
        {
            var f = Evaluate(zd) - rr;
            if (f < 0) lo = zd; else hi = zd;
            var d = Derivative(zd);
            var next = d > 0 ? zd - f / d : double.NaN;
            if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
            if (Math.Abs(next - zd) < 1e-15 || hi - lo < 1e-15) return next;
            zd = next;
        }
        return zd;
    }
}
