namespace Mosaic.Canvas;

/// <summary>What the plan needs of one chip of a field: its name, its pixel size and its celestial WCS.</summary>
public sealed record ChipFootprint
{
    /// <exception cref="ArgumentException">The name is empty or the size is not positive.</exception>
    public ChipFootprint(string name, int width, int height, Wcs.Wcs wcs)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(name);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(width);
        ArgumentOutOfRangeException.ThrowIfNegativeOrZero(height);
        ArgumentNullException.ThrowIfNull(wcs);
        Name = name; Width = width; Height = height; Wcs = wcs;
    }

    public string Name { get; }

    public int Width { get; }

    public int Height { get; }

    public Wcs.Wcs Wcs { get; }
}
