namespace Mosaic.Canvas;

/// <summary>A point in 1-based canvas pixel coordinates.</summary>
public readonly record struct CanvasPoint(double X, double Y);
