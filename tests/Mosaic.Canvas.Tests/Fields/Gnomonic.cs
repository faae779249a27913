namespace Mosaic.Canvas.Tests.Fields;

/// <summary>The inverse gnomonic projection (standard spherical trigonometry), to lay synthetic chips out on the sky.</summary>
internal static class Gnomonic
{
    /// <summary>The sky position (degrees, RA in [0, 360)) at tangent-plane offsets (east, north) in degrees from (ra0, dec0).</summary>
    public static (double Ra, double Dec) Offset(double ra0, double dec0, double east, double north)
    {
        const double D2R = Math.PI / 180;
        double xi = east * D2R, eta = north * D2R, d0 = dec0 * D2R;
        var denominator = Math.Cos(d0) - eta * Math.Sin(d0);
        var ra = ra0 + Math.Atan2(xi, denominator) / D2R;
        var dec = Math.Atan2(eta * Math.Cos(d0) + Math.Sin(d0), Math.Sqrt(xi * xi + denominator * denominator)) / D2R;
        ra %= 360;
        if (ra < 0) ra += 360;
        return (ra, dec);
    }
}
