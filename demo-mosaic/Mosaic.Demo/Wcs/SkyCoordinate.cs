namespace Mosaic.Demo.Wcs;

/// <summary>An ICRS position in degrees: right ascension in [0, 360), declination in [−90, 90].</summary>
public readonly record struct SkyCoordinate(double RaDegrees, double DecDegrees);
