namespace Mosaic.Wcs.Coordinates;

/// <summary>An equatorial sky position in degrees: RA normalised to [0, 360), Dec in [-90, 90].</summary>
public sealed record SkyPosition
{
    public SkyPosition(double rightAscension, double declination)
    {
        if (!double.IsFinite(rightAscension))
            throw new ArgumentOutOfRangeException(nameof(rightAscension), rightAscension, "RA must be a finite number of degrees");
        if (!double.IsFinite(declination) || declination < -90 || declination > 90)
            throw new ArgumentOutOfRangeException(nameof(declination), declination, "Dec must lie in [-90, 90] degrees");
        RightAscension = Angles.NormaliseDegrees(rightAscension);
        Declination = declination;
    }

    /// <summary>Right ascension in degrees, [0, 360).</summary>
    public double RightAscension { get; }

    /// <summary>Declination in degrees, [-90, 90].</summary>
    public double Declination { get; }
}
