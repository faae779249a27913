namespace Mosaic.Server.Security;

/// <summary>
/// Keeps the thread pool's minimum above what the expensive endpoints can hold. Each of those renders synchronously
/// on a pool thread; at the default minimum (one thread a core) a few of them leave no thread for a health check
/// or a tile until the pool injects more, which it does slowly (about one every half second when starved).
/// </summary>
public static class ThreadPoolFloor
{
    public static void Ensure(RequestLimits limits)
    {
        ArgumentNullException.ThrowIfNull(limits);
        ThreadPool.GetMinThreads(out var workers, out var completion);
        var wanted = limits.Concurrency + 4 * Environment.ProcessorCount;
        if (workers < wanted) ThreadPool.SetMinThreads(wanted, completion);
    }
}
