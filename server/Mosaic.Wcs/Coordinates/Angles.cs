namespace Mosaic.Wcs.Coordinates;

/// <summary>Degree helpers shared by the coordinate code.</summary>
internal static class Angles
{
    internal const double DegreesToRadians = Math.PI / 180.0;

    internal const double ArcsecondsToRadians = Math.PI / (180.0 * 3600.0);

    /// <summary>Maps any finite angle to [0, 360); the second test guards the rounding of tiny negatives up to 360.</summary>
    internal static double NormaliseDegrees(double degrees)
    {
        var wrapped = degrees % 360.0;
        if (wrapped < 0) wrapped += 360.0;
        return wrapped >= 360.0 ? 0.0 : wrapped;
    }
}
