namespace Mosaic.TileCache.Throttling;

/// <summary>
/// Bounds CPU-bound rendering: a fixed number of renders run, a fixed number wait, and anything beyond is refused
/// with <see cref="RenderQueueFullException"/> rather than left to queue without end.
/// </summary>
public sealed class RenderQueue : IDisposable
{
    private readonly SemaphoreSlim _slots;
    private readonly RenderQueueOptions _options;
    private int _admitted;

    public RenderQueue(RenderQueueOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        ArgumentOutOfRangeException.ThrowIfLessThan(options.ConcurrentRenders, 1, nameof(options.ConcurrentRenders));
        ArgumentOutOfRangeException.ThrowIfNegative(options.WaitingRenders, nameof(options.WaitingRenders));
        ArgumentOutOfRangeException.ThrowIfLessThan(options.RetryAfterSeconds, 1, nameof(options.RetryAfterSeconds));
        _options = options;
        _slots = new SemaphoreSlim(options.ConcurrentRenders, options.ConcurrentRenders);
    }

    public int ConcurrentRenders => _options.ConcurrentRenders;

    public int WaitingRenders => _options.WaitingRenders;

    /// <summary>Renders running or waiting now.</summary>
    public int Admitted => Volatile.Read(ref _admitted);

    /// <summary>Runs <paramref name="render"/> when a slot is free, on the caller's thread; refuses at once when the line is full.</summary>
    public async ValueTask<T> RunAsync<T>(Func<T> render, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(render);
        if (Interlocked.Increment(ref _admitted) > _options.ConcurrentRenders + _options.WaitingRenders)
        {
            Interlocked.Decrement(ref _admitted);
            throw new RenderQueueFullException(_options.ConcurrentRenders, _options.WaitingRenders, _options.RetryAfterSeconds);
        }
        try
        {
            await _slots.WaitAsync(cancellationToken).ConfigureAwait(false);
            try
            {
                return render();
            }
            finally
            {
                _slots.Release();
            }
        }
        finally
        {
            Interlocked.Decrement(ref _admitted);
        }
    }

    public void Dispose() => _slots.Dispose();
}
