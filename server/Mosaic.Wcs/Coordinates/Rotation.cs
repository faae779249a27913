namespace Mosaic.Wcs.Coordinates;

/// <summary>A 3×3 rotation between celestial frames, applied to unit vectors built from (longitude, latitude).</summary>
internal readonly struct Rotation
{
    private readonly double _m00, _m01, _m02, _m10, _m11, _m12, _m20, _m21, _m22;

    private Rotation(double m00, double m01, double m02, double m10, double m11, double m12, double m20, double m21, double m22)
    {
        (_m00, _m01, _m02, _m10, _m11, _m12, _m20, _m21, _m22) = (m00, m01, m02, m10, m11, m12, m20, m21, m22);
    }

    internal static Rotation Identity { get; } = new(1, 0, 0, 0, 1, 0, 0, 0, 1);

    /// <summary>Frame rotation about x by <paramref name="radians"/> (the sign convention of the FITS WCS papers and ERFA).</summary>
    internal static Rotation AboutX(double radians)
    {
        var (s, c) = Math.SinCos(radians);
        return new Rotation(1, 0, 0, 0, c, s, 0, -s, c);
    }

    internal static Rotation AboutY(double radians)
    {
        var (s, c) = Math.SinCos(radians);
        return new Rotation(c, 0, -s, 0, 1, 0, s, 0, c);
    }

    internal static Rotation AboutZ(double radians)
    {
        var (s, c) = Math.SinCos(radians);
        return new Rotation(c, s, 0, -s, c, 0, 0, 0, 1);
    }

    internal Rotation Times(Rotation b) => new(
        _m00 * b._m00 + _m01 * b._m10 + _m02 * b._m20, _m00 * b._m01 + _m01 * b._m11 + _m02 * b._m21, _m00 * b._m02 + _m01 * b._m12 + _m02 * b._m22,
        _m10 * b._m00 + _m11 * b._m10 + _m12 * b._m20, _m10 * b._m01 + _m11 * b._m11 + _m12 * b._m21, _m10 * b._m02 + _m11 * b._m12 + _m12 * b._m22,
        _m20 * b._m00 + _m21 * b._m10 + _m22 * b._m20, _m20 * b._m01 + _m21 * b._m11 + _m22 * b._m21, _m20 * b._m02 + _m21 * b._m12 + _m22 * b._m22);

    /// <summary>Rotations are orthogonal, so the inverse is the transpose.</summary>
    internal Rotation Transposed() => new(_m00, _m10, _m20, _m01, _m11, _m21, _m02, _m12, _m22);

    /// <summary>Rotates the direction (lon, lat) in degrees; returns (lon in [0, 360), lat).</summary>
    internal (double Longitude, double Latitude) Apply(double longitudeDegrees, double latitudeDegrees)
    {
        var (sinLon, cosLon) = Math.SinCos(longitudeDegrees * Angles.DegreesToRadians);
        var (sinLat, cosLat) = Math.SinCos(latitudeDegrees * Angles.DegreesToRadians);
        double x = cosLat * cosLon, y = cosLat * sinLon, z = sinLat;
        var rx = _m00 * x + _m01 * y + _m02 * z;
        var ry = _m10 * x + _m11 * y + _m12 * z;
        var rz = _m20 * x + _m21 * y + _m22 * z;
        // atan2 of the components keeps full precision near the poles, where asin(z) would not.
        var lon = Math.Atan2(ry, rx) / Angles.DegreesToRadians;
        var lat = Math.Atan2(rz, Math.Sqrt(rx * rx + ry * ry)) / Angles.DegreesToRadians;
        return (Angles.NormaliseDegrees(lon), Math.Clamp(lat, -90.0, 90.0));
    }
}
