namespace Mosaic.Fits.Tests.Hostile;

/// <summary>
/// Runs one open-and-read on a thread of its own, so a hang fails the test after a timeout instead of stalling the
/// run, and the bytes it allocates can be counted with GC.GetAllocatedBytesForCurrentThread (that thread only).
/// </summary>
public static class BoundedRun
{
    public static readonly TimeSpan Timeout = TimeSpan.FromSeconds(20);

    /// <summary>The exception <paramref name="action"/> threw (null if none) and the bytes it allocated.</summary>
    public static (Exception? Error, long AllocatedBytes) Run(Action action)
    {
        Exception? error = null;
        long allocated = 0;
        var thread = new Thread(() =>
        {
            var before = GC.GetAllocatedBytesForCurrentThread();
            try { action(); }
            catch (Exception e) { error = e; }
            allocated = GC.GetAllocatedBytesForCurrentThread() - before;
        }) { IsBackground = true, Name = "bounded-run" };
        thread.Start();
        Assert.True(thread.Join(Timeout), $"the read did not finish within {Timeout.TotalSeconds} s (a hang)");
        return (error, allocated);
    }
}
