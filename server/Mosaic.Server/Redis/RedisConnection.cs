using StackExchange.Redis;

namespace Mosaic.Server.Redis;

/// <summary>
/// The one multiplexer this instance shares among the tile tier, the meeting store and the SignalR backplane.
/// It connects when the host starts; with Redis down it keeps retrying in the background and the server serves on.
/// </summary>
public sealed class RedisConnection : IDisposable
{
    private readonly Lazy<ConnectionMultiplexer> _multiplexer;
    private readonly Lazy<IConnectionMultiplexer> _borrowed;
    private readonly ILogger<RedisConnection> _logger;
    private int _disposed;

    public RedisConnection(ConfigurationOptions options, ILogger<RedisConnection> logger)
    {
        _logger = logger;
        var endpoints = string.Join(", ", options.EndPoints);
        _multiplexer = new Lazy<ConnectionMultiplexer>(() =>
        {
            var multiplexer = ConnectionMultiplexer.Connect(options);
            multiplexer.ConnectionFailed += (_, e) =>
                _logger.LogWarning("Redis at {Endpoint} lost ({FailureType}): serving from this instance's own caches", e.EndPoint, e.FailureType);
            multiplexer.ConnectionRestored += (_, e) => _logger.LogInformation("Redis at {Endpoint} reachable again", e.EndPoint);
            if (!multiplexer.IsConnected)
                _logger.LogWarning("Redis at {Endpoints} not reachable at start; retrying in the background", endpoints);
            return multiplexer;
        }, LazyThreadSafetyMode.ExecutionAndPublication);
        _borrowed = new Lazy<IConnectionMultiplexer>(() => SharedMultiplexer.Over(_multiplexer.Value));
    }

    public IConnectionMultiplexer Multiplexer => _multiplexer.Value;

    /// <summary>The multiplexer for libraries that would close it when they are disposed: closing is a no-op here.</summary>
    public IConnectionMultiplexer Borrowed => _borrowed.Value;

    /// <summary>Whether a command sent now would reach a server; no round trip.</summary>
    public bool IsConnected => Multiplexer.IsConnected;

    /// <summary>Connects now (a hosted service calls this at start, <see cref="RedisConnectionStart"/>).</summary>
    public Task StartAsync(CancellationToken cancellationToken)
    {
        // Connect before the first request rather than during it.
        _ = _multiplexer.Value;
        return Task.CompletedTask;
    }

    public void Dispose()
    {
        if (!_multiplexer.IsValueCreated || Interlocked.Exchange(ref _disposed, 1) == 1) return;
        var multiplexer = _multiplexer.Value;
        try
        {
            // The backplane may be disposed after this and unsubscribes then: with nothing left subscribed it has
            // nothing to send over the closed connection.
            multiplexer.GetSubscriber().UnsubscribeAll(CommandFlags.FireAndForget);
        }
        catch (Exception e) when (e is RedisException or ObjectDisposedException)
        {
            // Redis already gone, or the multiplexer closed by its own failed reconnect: the subscriptions went with it.
        }
        multiplexer.Dispose();
    }
}
