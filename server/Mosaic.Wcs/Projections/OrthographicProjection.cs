namespace Mosaic.Wcs.Projections;

/// <summary>
/// SIN with the slant parameters xi = PV2_1, eta = PV2_2 (Paper II section 5.1.5, eqs. 40-45); the NCP form is
/// xi = 0, eta = cot(delta0) (section 6.1.2).
/// </summary>
public sealed class OrthographicProjection(double xi, double eta) : Projection
{
    public override double Theta0 => 90;

    public double Xi { get; } = xi;
    public double Eta { get; } = eta;

    public override bool TryNativeToPlane(double phi, double theta, out double x, out double y)
    {
        x = y = double.NaN;
        if (!double.IsFinite(phi) || !(theta is >= -90 and <= 90)) return false;
        double p = phi * D2R, t = theta * D2R;
        double ct = Math.Cos(t), st = Math.Sin(t);
        if (Xi == 0 && Eta == 0 && theta < 0) return false;
        double px = R2D * (ct * Math.Sin(p) + Xi * (1 - st));      // eq. 40
        double py = -R2D * (ct * Math.Cos(p) - Eta * (1 - st));    // eq. 41
        // Two points share each plane position; only the one the inverse returns (the visible one) has an image.
        if (Xi != 0 || Eta != 0)
        {
            if (!TryPlaneToNative(px, py, out _, out var back) || Math.Abs(Math.Sin(back * D2R) - st) > 1e-10) return false;
        }
        x = px; y = py;
        return true;
    }

    public override bool TryPlaneToNative(double x, double y, out double phi, out double theta)
    {
        phi = theta = double.NaN;
        double X = x * D2R, Y = y * D2R;
        if (Xi == 0 && Eta == 0)
        {
            var r2 = X * X + Y * Y;
            if (!(r2 <= 1)) return false;
            theta = Math.Acos(Math.Sqrt(r2)) * R2D;
            phi = r2 == 0 ? 0 : Math.Atan2(X, -Y) * R2D;
            return true;
        }
        // Eqs. 42-45: a quadratic in sin(theta); the root nearer +1 is the visible hemisphere.
        double a = Xi * Xi + Eta * Eta + 1;
        double b = Xi * (X - Xi) + Eta * (Y - Eta);
        double c = (X - Xi) * (X - Xi) + (Y - Eta) * (Y - Eta) - 1;
        var disc = b * b - a * c;
        if (!(disc >= 0)) return false;
        var st = (-b + Math.Sqrt(disc)) / a;
        if (st > 1 && st < 1 + 1e-13) st = 1;
        if (!(st is >= -1 and <= 1)) return false;
        var z = 1 - st;
        double u = X - Xi * z, v = -(Y - Eta * z);
        phi = u == 0 && v == 0 ? 0 : Math.Atan2(u, v) * R2D;
        // cos(theta) = |(u, v)| by eqs. 40-41; atan2 keeps full precision near the pole where asin does not.
        theta = Math.Atan2(st, Math.Sqrt(u * u + v * v)) * R2D;
        return true;
    }
}
