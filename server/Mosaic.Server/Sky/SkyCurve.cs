namespace Mosaic.Server.Sky;

/// <summary>A curve on the image given by a parameter (a declination along a meridian, an RA along a parallel); false where the point has no pixel.</summary>
internal delegate bool SkyCurve(double t, out double x, out double y);
