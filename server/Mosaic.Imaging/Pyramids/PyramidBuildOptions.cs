namespace Mosaic.Imaging.Pyramids;

/// <summary>What a pyramid build writes besides the reduced levels and the histogram.</summary>
public sealed record PyramidBuildOptions
{
    /// <summary>Reduced levels only: the native level is read from the source plane, which is cheap for a FITS chip.</summary>
    public static PyramidBuildOptions Default { get; } = new();

    /// <summary>
    /// Also writes the native level (z = MaxZoom) as a level file in the same tile layout, so native reads never
    /// touch the source again: for a source that is expensive to read, such as a canvas resampled from chips.
    /// </summary>
    public bool StoreNative { get; init; }
}
