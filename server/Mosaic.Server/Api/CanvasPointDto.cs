namespace Mosaic.Server.Api;

/// <summary>A position on the whole-field canvas, in 1-based canvas pixels.</summary>
public sealed record CanvasPointDto(double X, double Y);
