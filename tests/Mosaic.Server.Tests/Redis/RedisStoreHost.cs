using Microsoft.Extensions.Logging.Abstractions;
using Mosaic.Server.Meetings;
using Mosaic.Server.Redis;

namespace Mosaic.Server.Tests.Redis;

/// <summary>A Redis meeting store with its own connection, as one server instance holds it.</summary>
public sealed class RedisStoreHost : IDisposable
{
    public RedisStoreHost(RedisServer redis, MeetingLimits limits, TimeProvider clock)
    {
        Connection = new RedisConnection(RedisConfiguration.Parse(redis.Configuration), NullLogger<RedisConnection>.Instance);
        Store = new RedisMeetingStore(Connection, limits, clock);
        // Connected before use, as the server's start does.
        Connection.StartAsync(CancellationToken.None).GetAwaiter().GetResult();
    }

    public RedisConnection Connection { get; }

    public RedisMeetingStore Store { get; }

    public void Dispose() => Connection.Dispose();
}
