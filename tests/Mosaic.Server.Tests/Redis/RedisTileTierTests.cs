using System.Diagnostics;
using Microsoft.Extensions.Caching.StackExchangeRedis;
using Microsoft.Extensions.Logging.Abstractions;
using Microsoft.Extensions.Options;
using Mosaic.Server.Redis;

namespace Mosaic.Server.Tests.Redis;

/// <summary>
/// The shared tier alone against a real Redis: round trip, expiry set on the entry, and a Redis that hangs (DEBUG
/// SLEEP, a documented Redis command) or is gone costs a miss, never an exception.
/// </summary>
public sealed class RedisTileTierTests : IDisposable
{
    private readonly RedisServer _redis = RedisServer.Start();
    private readonly RedisConnection _connection;
    private readonly RedisCache _cache;
    private readonly RedisTileTierOptions _options = new() { Expiry = TimeSpan.FromMinutes(10), Timeout = TimeSpan.FromMilliseconds(300), RetryAfter = TimeSpan.FromMinutes(5) };

    public RedisTileTierTests()
    {
        _connection = new RedisConnection(RedisConfiguration.Parse(_redis.Configuration), NullLogger<RedisConnection>.Instance);
        _connection.StartAsync(CancellationToken.None).GetAwaiter().GetResult();
        _cache = new RedisCache(Options.Create(new RedisCacheOptions
        {
            ConnectionMultiplexerFactory = () => Task.FromResult(_connection.Borrowed),
            InstanceName = _options.KeyPrefix,
        }));
        // The cache's first command connects and compiles its code paths, which on a busy machine can take longer
        // than the tier's 300 ms timeout below and would open its circuit before the test begins.
        _cache.Get("warm-up");
    }

    private RedisTileTier NewTier(RedisTileTierOptions? options = null) =>
        new(_cache, _connection, options ?? _options, TimeProvider.System, NullLogger<RedisTileTier>.Instance);

    [Fact]
    public async Task A_tile_written_is_read_back_and_expires_as_configured()
    {
        // A round trip, not a timeout test: parallel test hosts can hold a thread past 300 ms on a busy machine.
        var tier = NewTier(new RedisTileTierOptions { Expiry = _options.Expiry, Timeout = TimeSpan.FromSeconds(10), RetryAfter = _options.RetryAfter });
        var bytes = Enumerable.Range(0, 5000).Select(i => (byte)(i * 7)).ToArray();
        Assert.Null(await tier.GetAsync("band-1/asinh/0/0/0", CancellationToken.None));
        await tier.SetAsync("band-1/asinh/0/0/0", bytes, CancellationToken.None);
        Assert.Equal(bytes, await tier.GetAsync("band-1/asinh/0/0/0", CancellationToken.None));

        // redis-cli: the key carries the prefix and a time to live within the ten minutes asked for.
        var ttl = long.Parse(_redis.Cli("TTL", "mosaic:tile:band-1/asinh/0/0/0"), System.Globalization.CultureInfo.InvariantCulture);
        Assert.InRange(ttl, 1, 600);
    }

    [Fact]
    public async Task A_hanging_Redis_is_a_miss_and_opens_the_circuit_so_later_requests_skip_it()
    {
        var tier = NewTier();
        await tier.SetAsync("k", [1, 2, 3], CancellationToken.None);
        using var sleeper = Process.Start(new ProcessStartInfo("redis-cli", ["-p", _redis.Port.ToString(System.Globalization.CultureInfo.InvariantCulture), "DEBUG", "SLEEP", "3"]) { RedirectStandardOutput = true })!;
        _redis.WaitUntilHung();

        Assert.Null(await tier.GetAsync("k", CancellationToken.None));
        Assert.True(tier.Circuit.IsOpen);
        // Open: the write is dropped without asking Redis, and the read is a miss even once Redis answers again.
        await tier.SetAsync("other", [4], CancellationToken.None);
        await sleeper.WaitForExitAsync();
        Assert.Null(await tier.GetAsync("k", CancellationToken.None));
        Assert.Equal("0", _redis.Cli("EXISTS", "mosaic:tile:other"));
    }

    [Fact]
    public async Task With_Redis_gone_reads_are_misses_and_writes_are_dropped_without_an_exception()
    {
        var tier = NewTier();
        _redis.Stop();
        var deadline = DateTime.UtcNow + TimeSpan.FromSeconds(15);
        while (_connection.IsConnected && DateTime.UtcNow < deadline) await Task.Delay(50);
        Assert.False(_connection.IsConnected);
        await tier.SetAsync("k", [1], CancellationToken.None);
        Assert.Null(await tier.GetAsync("k", CancellationToken.None));
    }

    public void Dispose()
    {
        _cache.Dispose();
        _connection.Dispose();
        _redis.Dispose();
    }
}
