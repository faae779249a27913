using Mosaic.Imaging.Pyramids;
using Mosaic.Server.Fields;

namespace Mosaic.Server.Pyramids;

/// <summary>The build state of one HDU's pyramid; written by the builder thread, read by requests.</summary>
internal sealed class PyramidEntry(FieldHdu hdu)
{
    public FieldHdu Hdu { get; } = hdu;

    public volatile PyramidState State = PyramidState.Queued;

    private double _progress;

    public double Progress
    {
        get => Volatile.Read(ref _progress);
        set => Volatile.Write(ref _progress, value);
    }

    public string? Error { get; set; }

    public Pyramid? Pyramid { get; set; }

    /// <summary>How long this process took to build it; null while queued or building, or when it came from the cache.</summary>
    public TimeSpan? BuildTime { get; set; }

    public PyramidStatus Status => new(State, State == PyramidState.Ready ? 1 : Progress, Error) { BuildTime = BuildTime };
}
