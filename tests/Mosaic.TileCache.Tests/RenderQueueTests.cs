using Mosaic.TileCache.Throttling;

namespace Mosaic.TileCache.Tests;

/// <summary>
/// The render queue's contract: a bounded number of renders at once, a bounded line, refusal beyond it with a wait
/// to retry after (the HTTP side is RFC 6585 section 4 and RFC 9110 section 10.2.3, checked in the server tests).
/// Bounded work queues with immediate refusal are common practice; the counts here are the test's own.
/// </summary>
public sealed class RenderQueueTests
{
    [Fact]
    public async Task Never_runs_more_renders_at_once_than_its_slots()
    {
        using var queue = new RenderQueue(new RenderQueueOptions { ConcurrentRenders = 2, WaitingRenders = 100 });
        using var gate = new ManualResetEventSlim();
        var running = 0;
        var most = 0;
        int Render()
        {
            var now = Interlocked.Increment(ref running);
            int seen;
            while ((seen = Volatile.Read(ref most)) < now && Interlocked.CompareExchange(ref most, now, seen) != seen) { }
            gate.Wait(TimeSpan.FromSeconds(30));
            Interlocked.Decrement(ref running);
            return now;
        }

        var renders = Enumerable.Range(0, 10).Select(_ => Task.Run(() => queue.RunAsync(Render).AsTask())).ToArray();
        // Every render admitted and the two slots taken; the other eight wait however long we look.
        var deadline = DateTime.UtcNow.AddSeconds(20);
        while ((queue.Admitted < 10 || Volatile.Read(ref running) < 2) && DateTime.UtcNow < deadline) await Task.Delay(10);
        await Task.Delay(100);
        Assert.Equal(10, queue.Admitted);
        Assert.Equal(2, Volatile.Read(ref running));

        gate.Set();
        await Task.WhenAll(renders);
        Assert.Equal(2, most);
        Assert.Equal(0, queue.Admitted);
    }

    [Fact]
    public async Task Refuses_at_once_beyond_its_slots_and_waiting_line_then_accepts_again()
    {
        using var queue = new RenderQueue(new RenderQueueOptions { ConcurrentRenders = 1, WaitingRenders = 1, RetryAfterSeconds = 3 });
        using var gate = new ManualResetEventSlim();
        var running = Task.Run(() => queue.RunAsync(() => gate.Wait(TimeSpan.FromSeconds(20))).AsTask());
        while (queue.Admitted < 1) await Task.Delay(5);
        var waiting = queue.RunAsync(() => true).AsTask();
        Assert.False(waiting.IsCompleted);

        var refused = await Assert.ThrowsAsync<RenderQueueFullException>(() => queue.RunAsync(() => true).AsTask());
        Assert.Equal(3, refused.RetryAfterSeconds);
        Assert.Contains("ask again in 3 s", refused.Message);

        gate.Set();
        Assert.True(await running);
        Assert.True(await waiting);
        Assert.Equal(7, await queue.RunAsync(() => 7));
    }

    [Fact]
    public async Task A_cancelled_wait_leaves_the_line()
    {
        using var queue = new RenderQueue(new RenderQueueOptions { ConcurrentRenders = 1, WaitingRenders = 1 });
        using var gate = new ManualResetEventSlim();
        var running = Task.Run(() => queue.RunAsync(() => gate.Wait(TimeSpan.FromSeconds(20))).AsTask());
        while (queue.Admitted < 1) await Task.Delay(5);
        using var cancel = new CancellationTokenSource();
        var waiting = queue.RunAsync(() => true, cancel.Token).AsTask();
        cancel.Cancel();
        await Assert.ThrowsAnyAsync<OperationCanceledException>(() => waiting);
        Assert.Equal(1, queue.Admitted);
        gate.Set();
        await running;
    }

    [Theory]
    [InlineData(0, 1, 1, "ConcurrentRenders")]
    [InlineData(1, -1, 1, "WaitingRenders")]
    [InlineData(1, 1, 0, "RetryAfterSeconds")]
    public void Rejects_bad_options(int concurrent, int waiting, int retryAfter, string name)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() =>
            new RenderQueue(new RenderQueueOptions { ConcurrentRenders = concurrent, WaitingRenders = waiting, RetryAfterSeconds = retryAfter }));
        Assert.Contains(name, error.Message);
    }
}
