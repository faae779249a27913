namespace Mosaic.Browser.Tests.Reference;

/// <summary>
/// The sky around one pixel position as astropy sees it: its ICRS position, the directions of increasing Dec
/// (north) and RA (east) in pixel axes, and the pixel scale in arcsec per pixel.
/// </summary>
public sealed record LocalSky(double Ra, double Dec, PixelVector North, PixelVector East, double PixelScale);
