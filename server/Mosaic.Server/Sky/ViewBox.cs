namespace Mosaic.Server.Sky;

/// <summary>
/// The visible part of an image, [X0, X1] x [Y0, Y1] in 1-based FITS pixel coordinates (it may reach past the
/// image), drawn on a Width x Height screen area in CSS pixels.
/// </summary>
public sealed record ViewBox
{
    public ViewBox(double x0, double y0, double x1, double y1, double width, double height)
    {
        if (!(double.IsFinite(x0) && double.IsFinite(x1) && x0 < x1)) throw new ArgumentOutOfRangeException(nameof(x1), "the box needs finite x0 < x1");
        if (!(double.IsFinite(y0) && double.IsFinite(y1) && y0 < y1)) throw new ArgumentOutOfRangeException(nameof(y1), "the box needs finite y0 < y1");
        if (!(double.IsFinite(width) && width > 0)) throw new ArgumentOutOfRangeException(nameof(width), "the screen width must be positive");
        if (!(double.IsFinite(height) && height > 0)) throw new ArgumentOutOfRangeException(nameof(height), "the screen height must be positive");
        (X0, Y0, X1, Y1, Width, Height) = (x0, y0, x1, y1, width, height);
    }

    public double X0 { get; }
    public double Y0 { get; }
    public double X1 { get; }
    public double Y1 { get; }
    public double Width { get; }
    public double Height { get; }

    /// <summary>Screen pixels per image pixel along x.</summary>
    public double ScaleX => Width / (X1 - X0);

    /// <summary>Screen pixels per image pixel along y.</summary>
    public double ScaleY => Height / (Y1 - Y0);

    public PixelPoint Centre => new((X0 + X1) / 2, (Y0 + Y1) / 2);

    public bool Contains(double x, double y) => x >= X0 && x <= X1 && y >= Y0 && y <= Y1;

    /// <summary>This box grown (or, for a negative amount, shrunk) by a number of screen pixels on every side.</summary>
    public ViewBox Grown(double screenPixels)
    {
        double gx = screenPixels / ScaleX, gy = screenPixels / ScaleY;
        return new ViewBox(X0 - gx, Y0 - gy, X1 + gx, Y1 + gy, Width + 2 * screenPixels, Height + 2 * screenPixels);
    }

    /// <summary>Distance in screen pixels between two image positions.</summary>
    public double ScreenDistance(PixelPoint a, PixelPoint b)
    {
        double dx = (a.X - b.X) * ScaleX, dy = (a.Y - b.Y) * ScaleY;
        return Math.Sqrt(dx * dx + dy * dy);
    }
}
