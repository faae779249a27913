namespace Mosaic.Canvas.Geometry;

/// <summary>The pixel scale of a WCS at a pixel: the square root of the area of one pixel on the tangent plane there.</summary>
internal static class LocalScale
{
    private const double D2R = Math.PI / 180;

    /// <summary>Degrees per pixel at 1-based pixel (x, y); NaN where the WCS has no sky position around it.</summary>
    public static double At(Wcs.Wcs wcs, double x, double y)
    {
        if (!wcs.TryPixelToSky(x, y, out var lon, out var lat)) return double.NaN;
        var c = UnitVector.FromLonLat(lon, lat);
        double a = lon * D2R, d = lat * D2R;
        var east = new UnitVector(-Math.Sin(a), Math.Cos(a), 0);
        var north = new UnitVector(-Math.Sin(d) * Math.Cos(a), -Math.Sin(d) * Math.Sin(a), Math.Cos(d));
        // Central differences of one pixel on the gnomonic plane about (x, y): its curvature is negligible over a pixel.
        if (!Plane(wcs, x + 1, y, c, east, north, out var xp) || !Plane(wcs, x - 1, y, c, east, north, out var xm)
            || !Plane(wcs, x, y + 1, c, east, north, out var yp) || !Plane(wcs, x, y - 1, c, east, north, out var ym))
            return double.NaN;
        double j11 = (xp.Xi - xm.Xi) / 2, j21 = (xp.Eta - xm.Eta) / 2, j12 = (yp.Xi - ym.Xi) / 2, j22 = (yp.Eta - ym.Eta) / 2;
        return Math.Sqrt(Math.Abs(j11 * j22 - j12 * j21)) / D2R;
    }

    private static bool Plane(Wcs.Wcs wcs, double x, double y, UnitVector c, UnitVector east, UnitVector north, out (double Xi, double Eta) p)
    {
        p = default;
        if (!wcs.TryPixelToSky(x, y, out var lon, out var lat)) return false;
        var v = UnitVector.FromLonLat(lon, lat);
        var w = v.Dot(c);
        if (!(w > 0)) return false;
        p = (v.Dot(east) / w, v.Dot(north) / w);
        return true;
    }
}
