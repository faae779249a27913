namespace Mosaic.Wcs.Coordinates;

/// <summary>A Galactic position in degrees: longitude l in [0, 360), latitude b in [-90, 90].</summary>
public sealed record GalacticPosition
{
    public GalacticPosition(double longitude, double latitude)
    {
        if (!double.IsFinite(longitude))
            throw new ArgumentOutOfRangeException(nameof(longitude), longitude, "Galactic longitude must be a finite number of degrees");
        if (!double.IsFinite(latitude) || latitude < -90 || latitude > 90)
            throw new ArgumentOutOfRangeException(nameof(latitude), latitude, "Galactic latitude must lie in [-90, 90] degrees");
        Longitude = Angles.NormaliseDegrees(longitude);
        Latitude = latitude;
    }

    /// <summary>Galactic longitude l in degrees, [0, 360).</summary>
    public double Longitude { get; }

    /// <summary>Galactic latitude b in degrees, [-90, 90].</summary>
    public double Latitude { get; }
}
