namespace Mosaic.Server.Redis;

/// <summary>
/// Closed while Redis answers; open for a while after a failure, during which callers skip Redis; then one caller
/// at a time probes, and a success closes it again.
/// </summary>
public sealed class RedisCircuit(TimeSpan retryAfter, TimeProvider clock)
{
    // 0 while closed; otherwise the tick (UTC) before which no one tries.
    private long _openUntil;

    public bool IsOpen => Volatile.Read(ref _openUntil) != 0;

    /// <summary>Whether this caller may use Redis now: always while closed; once it is open, one caller per retry interval.</summary>
    public bool TryEnter()
    {
        var until = Volatile.Read(ref _openUntil);
        if (until == 0) return true;
        var now = clock.GetUtcNow().UtcTicks;
        if (now < until) return false;
        // Only the caller that moves the deadline probes; the others keep answering locally.
        return Interlocked.CompareExchange(ref _openUntil, now + retryAfter.Ticks, until) == until;
    }

    public void Succeeded() => Volatile.Write(ref _openUntil, 0);

    public void Failed() => Volatile.Write(ref _openUntil, clock.GetUtcNow().UtcTicks + retryAfter.Ticks);
}
