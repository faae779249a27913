using Mosaic.Server.Redis;
using Mosaic.Server.Tests.Meetings;

namespace Mosaic.Server.Tests.Redis;

/// <summary>The back-off around the shared tier: the circuit-breaker pattern (common practice), on a hand-moved clock.</summary>
public sealed class RedisCircuitTests
{
    private static readonly TimeSpan Retry = TimeSpan.FromSeconds(3);

    [Fact]
    public void After_a_failure_no_one_tries_until_the_retry_time_then_exactly_one_caller_probes()
    {
        var clock = new ManualClock();
        var circuit = new RedisCircuit(Retry, clock);
        Assert.True(circuit.TryEnter());
        Assert.False(circuit.IsOpen);

        circuit.Failed();
        Assert.True(circuit.IsOpen);
        Assert.False(circuit.TryEnter());
        clock.Advance(Retry - TimeSpan.FromMilliseconds(1));
        Assert.False(circuit.TryEnter());

        clock.Advance(TimeSpan.FromMilliseconds(1));
        var entered = Enumerable.Range(0, 50).AsParallel().Count(_ => circuit.TryEnter());
        Assert.Equal(1, entered);

        // The probe failed: another full wait.
        circuit.Failed();
        clock.Advance(Retry / 2);
        Assert.False(circuit.TryEnter());
        clock.Advance(Retry);
        Assert.True(circuit.TryEnter());

        // The probe succeeded: everyone goes through again.
        circuit.Succeeded();
        Assert.False(circuit.IsOpen);
        Assert.Equal(50, Enumerable.Range(0, 50).AsParallel().Count(_ => circuit.TryEnter()));
    }
}
