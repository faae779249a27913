using System.Text.Json;

namespace Mosaic.Browser.Tests.Hosting;

/// <summary>A chip on the whole field: its HDU, name and outline (a closed polygon in 1-based canvas pixels).</summary>
public sealed record PlacedChipInfo(int Hdu, string Name, IReadOnlyList<(double X, double Y)> Outline)
{
    public double MinX => Outline.Min(p => p.X);

    public double MaxX => Outline.Max(p => p.X);

    public double MinY => Outline.Min(p => p.Y);

    public double MaxY => Outline.Max(p => p.Y);

    /// <summary>Whether a canvas point lies inside the outline (even-odd ray casting, common practice).</summary>
    public bool Contains(double x, double y)
    {
        var inside = false;
        for (int i = 0, j = Outline.Count - 1; i < Outline.Count; j = i++)
        {
            var (xi, yi) = Outline[i];
            var (xj, yj) = Outline[j];
            if ((yi > y) != (yj > y) && x < (xj - xi) * (y - yi) / (yj - yi) + xi) inside = !inside;
        }
        return inside;
    }

    public static PlacedChipInfo Parse(JsonElement chip) => new(
        chip.GetProperty("hdu").GetInt32(),
        chip.GetProperty("name").GetString()!,
        [.. chip.GetProperty("outline").EnumerateArray().Select(p => (p[0].GetDouble(), p[1].GetDouble()))]);
}
