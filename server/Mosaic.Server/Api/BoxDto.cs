namespace Mosaic.Server.Api;

/// <summary>A pixel box, FITS 1-based, corners inclusive.</summary>
public sealed record BoxDto(int X0, int Y0, int X1, int Y1);
