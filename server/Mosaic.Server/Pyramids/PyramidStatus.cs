namespace Mosaic.Server.Pyramids;

/// <summary>How far the pyramid of one HDU is, as the UI shows it.</summary>
public sealed record PyramidStatus(PyramidState State, double Progress, string? Error)
{
    /// <summary>How long this process took to build the pyramid (builds overlap, so not the gap between two finishing); null unless it built it.</summary>
    public TimeSpan? BuildTime { get; init; }
}
