namespace Mosaic.Canvas.Geometry;

/// <summary>
/// Points along the outer edge of a chip in its 1-based pixel coordinates: from the corner (0.5, 0.5) counter-clockwise
/// along the bottom (y = 0.5), right (x = W + 0.5), top (y = H + 0.5) and left (x = 0.5) edges, each edge cut into
/// ceil(length / step) equal steps, the first point repeated at the end.
/// </summary>
internal static class ChipEdge
{
    public static List<(double X, double Y)> Points(int width, int height, int step)
    {
        double x0 = 0.5, y0 = 0.5, x1 = width + 0.5, y1 = height + 0.5;
        int nx = Math.Max(1, (width + step - 1) / step), ny = Math.Max(1, (height + step - 1) / step);
        var points = new List<(double, double)>(2 * (nx + ny) + 1);
        for (var i = 0; i < nx; i++) points.Add((x0 + (double)width * i / nx, y0));
        for (var i = 0; i < ny; i++) points.Add((x1, y0 + (double)height * i / ny));
        for (var i = 0; i < nx; i++) points.Add((x1 - (double)width * i / nx, y1));
        for (var i = 0; i < ny; i++) points.Add((x0, y1 - (double)height * i / ny));
        points.Add((x0, y0));
        return points;
    }

    /// <summary>The centre of the chip, 1-based: ((W + 1) / 2, (H + 1) / 2).</summary>
    public static (double X, double Y) Centre(int width, int height) => ((width + 1) / 2.0, (height + 1) / 2.0);
}
