namespace Mosaic.Canvas;

/// <summary>An axis-aligned box in 1-based canvas pixel coordinates.</summary>
public readonly record struct CanvasBox(double MinX, double MinY, double MaxX, double MaxY)
{
    public bool Contains(double x, double y) => x >= MinX && x <= MaxX && y >= MinY && y <= MaxY;
}
