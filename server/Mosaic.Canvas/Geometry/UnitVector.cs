namespace Mosaic.Canvas.Geometry;

/// <summary>A direction on the sphere as a Cartesian unit vector, for averaging and local scales.</summary>
internal readonly record struct UnitVector(double X, double Y, double Z)
{
    private const double D2R = Math.PI / 180;

    public static UnitVector FromLonLat(double lon, double lat)
    {
        double a = lon * D2R, d = lat * D2R;
        return new UnitVector(Math.Cos(d) * Math.Cos(a), Math.Cos(d) * Math.Sin(a), Math.Sin(d));
    }

    public (double Lon, double Lat) ToLonLat()
    {
        var lon = Math.Atan2(Y, X) / D2R;
        if (lon < 0) lon += 360;
        if (lon >= 360) lon = 0;
        return (lon, Math.Atan2(Z, Math.Sqrt(X * X + Y * Y)) / D2R);
    }

    public double Dot(UnitVector o) => X * o.X + Y * o.Y + Z * o.Z;
}
