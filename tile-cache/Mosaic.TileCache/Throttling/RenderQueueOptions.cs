namespace Mosaic.TileCache.Throttling;

public sealed class RenderQueueOptions
{
    /// <summary>Renders running at once: one per core, since a render keeps a core busy from start to end.</summary>
    public int ConcurrentRenders { get; set; } = Environment.ProcessorCount;

    /// <summary>Renders allowed to wait for a free slot; a request beyond them is refused at once.</summary>
    public int WaitingRenders { get; set; } = 256;

    /// <summary>What a refused request is told to wait before asking again.</summary>
    public int RetryAfterSeconds { get; set; } = 1;
}
