namespace Mosaic.Server.Api;

/// <summary>The pixel that contains a probed point. X and Y are FITS 1-based; Value is physical, null where masked.</summary>
public sealed record ProbeDto(string Field, string Band, int Hdu, string HduName, int X, int Y, double? Value, string? Bunit);
