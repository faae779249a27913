namespace Mosaic.Browser.Tests.Reference;

/// <summary>A FITS pixel position (1-based) and its ICRS RA/Dec and Galactic l/b in degrees, as astropy computes them.</summary>
public sealed record SkyPoint(double X, double Y, double Ra, double Dec, double L, double B);
