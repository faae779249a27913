namespace Mosaic.Browser.Tests.Reference;

/// <summary>A pixel as astropy reads it: FITS 1-based x, y and its physical value, null where NaN (masked).</summary>
public sealed record FitsPixel(int X, int Y, double? Value);
