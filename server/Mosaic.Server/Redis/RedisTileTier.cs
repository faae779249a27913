using Microsoft.Extensions.Caching.Distributed;
using Mosaic.TileCache;

namespace Mosaic.Server.Redis;

/// <summary>
/// The tile tier shared by every instance on the same Redis, over <see cref="IDistributedCache"/>. It never throws
/// for Redis trouble: an unreachable or slow Redis is a miss, a write that cannot be made is dropped, and after a
/// failure the tier stays out of the way for a few seconds before trying again.
/// </summary>
public sealed class RedisTileTier : ISharedTileTier
{
    private readonly IDistributedCache _cache;
    private readonly RedisConnection _connection;
    private readonly RedisTileTierOptions _options;
    private readonly ILogger<RedisTileTier> _logger;
    private readonly DistributedCacheEntryOptions _entry;

    public RedisTileTier(IDistributedCache cache, RedisConnection connection, RedisTileTierOptions options, TimeProvider clock, ILogger<RedisTileTier> logger)
    {
        _cache = cache;
        _connection = connection;
        _options = options;
        _logger = logger;
        _entry = new DistributedCacheEntryOptions { AbsoluteExpirationRelativeToNow = options.Expiry };
        Circuit = new RedisCircuit(options.RetryAfter, clock);
    }

    /// <summary>Open while the tier is skipping Redis after a failure.</summary>
    public RedisCircuit Circuit { get; }

    public async ValueTask<byte[]?> GetAsync(string key, CancellationToken cancellationToken)
    {
        if (!Usable()) return null;
        try
        {
            var bytes = await _cache.GetAsync(key, cancellationToken).WaitAsync(_options.Timeout, cancellationToken).ConfigureAwait(false);
            Circuit.Succeeded();
            return bytes;
        }
        catch (Exception e) when (IsRedisTrouble(e, cancellationToken))
        {
            Trip(e, "read");
            return null;
        }
    }

    public async ValueTask SetAsync(string key, byte[] bytes, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(bytes);
        if (!Usable()) return;
        try
        {
            await _cache.SetAsync(key, bytes, _entry, cancellationToken).WaitAsync(_options.Timeout, cancellationToken).ConfigureAwait(false);
            Circuit.Succeeded();
        }
        catch (Exception e) when (IsRedisTrouble(e, cancellationToken))
        {
            Trip(e, "write");
        }
    }

    // A disconnected multiplexer would only fail the command: skip it without counting a failure.
    private bool Usable() => _connection.IsConnected && Circuit.TryEnter();

    private void Trip(Exception e, string what)
    {
        var wasOpen = Circuit.IsOpen;
        Circuit.Failed();
        if (!wasOpen)
            _logger.LogWarning("Shared tile {What} failed ({Error}); tiles come from this instance for the next {Seconds} s",
                what, e.GetType().Name, _options.RetryAfter.TotalSeconds);
    }

    // Everything but the caller's own cancellation: the tier must never fail a tile request.
    private static bool IsRedisTrouble(Exception e, CancellationToken cancellationToken) =>
        !(e is OperationCanceledException && cancellationToken.IsCancellationRequested);
}
