using Mosaic.Imaging.Statistics;
using Mosaic.Imaging.Rendering;

namespace Mosaic.Imaging.Display;

/// <summary>CONTRACT STUB: how a viewer wants values shown: value limits, then a stretch, then a palette.</summary>
public sealed record DisplaySettings
{
    /// <summary>asinh with field-wide limits from the band's histogram: shows a field well without tuning.</summary>
    public static DisplaySettings Default { get; } = new();

    /// <summary>A stable text form, the same for equal settings: part of tile cache keys and ETags.</summary>
    public string CanonicalKey => throw new NotImplementedException();

    /// <summary>Limits resolved against the band's field-wide statistics, compiled for the tile loop.</summary>
    public ToneMap Compile(BandStatistics statistics, ValueHistogram histogram) => throw new NotImplementedException();
}
