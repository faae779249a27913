namespace Mosaic.Server.Sky;

/// <summary>A point of a traced curve: its parameter and its pixel position.</summary>
internal readonly record struct TracePoint(double T, double X, double Y)
{
    public PixelPoint Pixel => new(X, Y);
}
