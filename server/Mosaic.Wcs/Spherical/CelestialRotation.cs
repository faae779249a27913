using Mosaic.Wcs.Header;
using Mosaic.Wcs.Projections;

namespace Mosaic.Wcs.Spherical;

/// <summary>
/// The rotation between native spherical (phi, theta) and celestial (alpha, delta) coordinates, Paper II
/// (Calabretta &amp; Greisen 2002) section 2.3 eqs. 2 and 5, with the celestial pole found from CRVAL, LONPOLE and
/// LATPOLE as in section 2.4 (eqs. 8-10). Degrees throughout.
/// </summary>
public sealed class CelestialRotation
{
    private const double D2R = Math.PI / 180;
    private const double R2D = 180 / Math.PI;
    private readonly double _alphaP, _phiP, _sinDeltaP, _cosDeltaP;

    /// <summary>Celestial coordinates of the native pole (alpha_p, delta_p) and the native longitude phi_p of the celestial pole.</summary>
    public double AlphaP => _alphaP;
    public double DeltaP { get; }
    public double PhiP => _phiP;

    public CelestialRotation(double alphaP, double deltaP, double phiP)
    {
        _alphaP = alphaP; DeltaP = deltaP; _phiP = phiP;
        _sinDeltaP = Math.Sin(deltaP * D2R);
        _cosDeltaP = Math.Cos(deltaP * D2R);
        if (Math.Abs(deltaP) == 90) _cosDeltaP = 0;
    }

    /// <exception cref="WcsHeaderException">CRVAL, LONPOLE and LATPOLE admit no celestial pole.</exception>
    public static CelestialRotation From(WcsHeader header, Projection projection)
    {
        ArgumentNullException.ThrowIfNull(header);
        ArgumentNullException.ThrowIfNull(projection);
        double alpha0 = header.CrVal1, delta0 = header.CrVal2;
        double phi0 = projection.Phi0, theta0 = projection.Theta0;
        if (!(delta0 is >= -90 and <= 90)) throw new WcsHeaderException("CRVAL2", $"latitude {delta0} is outside [-90, 90]");
        // Section 2.4: LONPOLE defaults to 0 when delta0 >= theta0, else 180 (plus phi0).
        var phiP = header.LonPole ?? (delta0 >= theta0 ? 0 : 180) + phi0;
        if (theta0 == 90) return new CelestialRotation(alpha0, delta0, phiP);

        var latPole = header.LatPole ?? 90;
        double dphi = (phiP - phi0) * D2R, t0 = theta0 * D2R, d0 = delta0 * D2R;
        // Eq. 8: two solutions for delta_p; LATPOLE picks the nearer.
        var baseAngle = Math.Atan2(Math.Sin(t0), Math.Cos(t0) * Math.Cos(dphi)) * R2D;
        var norm = Math.Sqrt(1 - Math.Cos(t0) * Math.Cos(t0) * Math.Sin(dphi) * Math.Sin(dphi));
        var ratio = norm == 0 ? double.NaN : Math.Sin(d0) / norm;
        if (Math.Abs(ratio) > 1 && Math.Abs(ratio) < 1 + 1e-12) ratio = Math.Sign(ratio);
        if (!(Math.Abs(ratio) <= 1)) throw new WcsHeaderException("LONPOLE", "CRVAL2 and LONPOLE admit no celestial pole");
        var spread = Math.Acos(ratio) * R2D;
        // Both are angles: brought into [-180, 180] an apparently out-of-range one may still be a latitude.
        double first = Wrap(baseAngle + spread), second = Wrap(baseAngle - spread);
        var firstOk = first is >= -90 - 1e-10 and <= 90 + 1e-10;
        var secondOk = second is >= -90 - 1e-10 and <= 90 + 1e-10;
        if (!firstOk && !secondOk) throw new WcsHeaderException("LONPOLE", "CRVAL2 and LONPOLE admit no celestial pole");
        double deltaP = firstOk && secondOk
            ? (Math.Abs(first - latPole) <= Math.Abs(second - latPole) ? first : second)
            : firstOk ? first : second;
        deltaP = Math.Clamp(deltaP, -90, 90);

        // Eq. 10 for alpha_p, with the special cases of a reference point or native pole at a celestial pole.
        double alphaP;
        if (Math.Abs(delta0) == 90) alphaP = alpha0;
        else if (Math.Abs(deltaP) == 90)
            alphaP = deltaP > 0 ? alpha0 + phiP - phi0 - 180 : alpha0 - phiP + phi0;
        else
        {
            var dp = deltaP * D2R;
            alphaP = alpha0 - Math.Atan2(Math.Sin(dphi) * Math.Cos(t0) / Math.Cos(d0),
                (Math.Sin(t0) - Math.Sin(dp) * Math.Sin(d0)) / (Math.Cos(dp) * Math.Cos(d0))) * R2D;
        }
        return new CelestialRotation(alphaP, deltaP, phiP);
    }

    /// <summary>Eq. 2: native (phi, theta) to celestial (alpha, delta); alpha in [0, 360).</summary>
    public (double Alpha, double Delta) NativeToCelestial(double phi, double theta)
    {
        double t = theta * D2R, dp = (phi - _phiP) * D2R;
        double st = Math.Sin(t), ct = Math.Cos(t);
        double u = -ct * Math.Sin(dp), v = st * _cosDeltaP - ct * _sinDeltaP * Math.Cos(dp);
        var alpha = _alphaP + Math.Atan2(u, v) * R2D;
        var sinDelta = st * _sinDeltaP + ct * _cosDeltaP * Math.Cos(dp);
        // (u, v) has length cos(delta): atan2 keeps full precision near the poles where asin does not.
        return (Normalize(alpha), Math.Atan2(sinDelta, Math.Sqrt(u * u + v * v)) * R2D);
    }

    /// <summary>Eq. 5: celestial (alpha, delta) to native (phi, theta); phi in [-180, 180).</summary>
    public (double Phi, double Theta) CelestialToNative(double alpha, double delta)
    {
        double d = delta * D2R, da = (alpha - _alphaP) * D2R;
        double sd = Math.Sin(d), cd = Math.Cos(d);
        double u = -cd * Math.Sin(da), v = sd * _cosDeltaP - cd * _sinDeltaP * Math.Cos(da);
        var phi = Normalize(_phiP + Math.Atan2(u, v) * R2D + 180) - 180;
        var sinTheta = sd * _sinDeltaP + cd * _cosDeltaP * Math.Cos(da);
        return (phi, Math.Atan2(sinTheta, Math.Sqrt(u * u + v * v)) * R2D);
    }

    private static double Wrap(double degrees) => degrees > 180 ? degrees - 360 : degrees < -180 ? degrees + 360 : degrees;

    private static double Normalize(double degrees)
    {
        var r = degrees % 360;
        if (r < 0) r += 360;
        return r >= 360 ? 0 : r;
    }
}
