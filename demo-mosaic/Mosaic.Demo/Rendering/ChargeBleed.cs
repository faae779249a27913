namespace Mosaic.Demo.Rendering;

/// <summary>
/// Blooming: charge above a pixel's full well spills into its column neighbours, half up and half down, filling each to
/// full well in turn until the excess is spent (charge conserving, the usual CCD behaviour — common practice). Every
/// pixel at full well is then masked as NaN.
/// </summary>
internal static class ChargeBleed
{
    /// <param name="regions">Boxes (x0, y0, x1, y1, inclusive) that may hold pixels above full well.</param>
    public static void Apply(Span<float> image, int width, int height, float fullWell, IReadOnlyList<(int X0, int Y0, int X1, int Y1)> regions)
    {
        foreach (var (x0, y0, x1, y1) in regions)
        for (var x = Math.Max(0, x0); x <= Math.Min(width - 1, x1); x++)
        {
            var y = Math.Max(0, y0);
            var yEnd = Math.Min(height - 1, y1);
            while (y <= yEnd)
            {
                if (!(image[y * width + x] > fullWell)) { y++; continue; }
                var start = y;
                double excess = 0;
                while (y <= yEnd && image[y * width + x] >= fullWell)
                {
                    excess += image[y * width + x] - fullWell;
                    image[y * width + x] = fullWell;
                    y++;
                }
                Spill(image, width, height, x, y, +1, excess / 2, fullWell);
                Spill(image, width, height, x, start - 1, -1, excess / 2, fullWell);
            }
        }

        foreach (var (x0, _, x1, _) in regions)
        for (var x = Math.Max(0, x0); x <= Math.Min(width - 1, x1); x++)
        for (var y = 0; y < height; y++)
            if (image[y * width + x] >= fullWell) image[y * width + x] = float.NaN;
    }

    private static void Spill(Span<float> image, int width, int height, int x, int y, int direction, double charge, float fullWell)
    {
        // Charge that reaches the end of the column is lost to the serial register.
        for (; charge > 0 && y >= 0 && y < height; y += direction)
        {
            ref var pixel = ref image[y * width + x];
            var room = fullWell - pixel;
            if (room <= 0) continue;
            if (charge >= room)
            {
                pixel = fullWell;
                charge -= room;
            }
            else
            {
                pixel += (float)charge;
                charge = 0;
            }
        }
    }
}
