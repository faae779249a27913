using Mosaic.Wcs.Coordinates;

namespace Mosaic.Canvas.Geometry;

/// <summary>Carries (longitude, latitude) in degrees from one celestial frame to another, through ICRS when they differ.</summary>
internal sealed class FrameLink
{
    private readonly CelestialFrame _from;
    private readonly CelestialFrame _to;

    public FrameLink(CelestialFrame from, CelestialFrame to)
    {
        _from = from;
        _to = to;
        IsIdentity = SameFrame(from, to);
    }

    public bool IsIdentity { get; }

    public (double Lon, double Lat) Apply(double lon, double lat) =>
        IsIdentity ? (lon, lat) : _to.FromIcrs(_from.ToIcrs(lon, lat));

    public static bool SameFrame(CelestialFrame a, CelestialFrame b) => a.Kind == b.Kind && a.Equinox == b.Equinox;
}
