namespace Mosaic.Canvas.Resampling;

/// <summary>A rectangle of chip pixels held in memory, 0-based inclusive bounds, row-major.</summary>
internal readonly ref struct ChipRect
{
    public ChipRect(int x0, int y0, int x1, int y1, Span<float> values)
    {
        X0 = x0; Y0 = y0; X1 = x1; Y1 = y1; Values = values;
    }

    public int X0 { get; }
    public int Y0 { get; }
    public int X1 { get; }
    public int Y1 { get; }
    public int Width => X1 - X0 + 1;
    public Span<float> Values { get; }
}
