namespace Mosaic.TileCache.Throttling;

/// <summary>Every render slot is busy and the waiting line is full: the client asks again after <see cref="RetryAfterSeconds"/>.</summary>
public sealed class RenderQueueFullException(int concurrentRenders, int waitingRenders, int retryAfterSeconds)
    : Exception($"The server is rendering {concurrentRenders} images at once with {waitingRenders} more waiting, its limit; ask again in {retryAfterSeconds} s.")
{
    public int RetryAfterSeconds { get; } = retryAfterSeconds;
}
