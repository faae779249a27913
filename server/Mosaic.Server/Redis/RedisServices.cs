using Microsoft.Extensions.Caching.StackExchangeRedis;
using Microsoft.Extensions.DependencyInjection.Extensions;
using Mosaic.TileCache;

namespace Mosaic.Server.Redis;

public static class RedisServices
{
    /// <summary>
    /// The shared multiplexer (connected when the host starts) and the shared tile tier over it. The meeting store
    /// and the SignalR backplane over the same connection come with <c>AddMeetings(sharedOverRedis: true)</c>.
    /// Throws <see cref="ArgumentException"/> at once for a --redis value that cannot be read.
    /// </summary>
    public static IServiceCollection AddMosaicRedis(this IServiceCollection services, string configuration)
    {
        var options = RedisConfiguration.Parse(configuration);
        services.TryAddSingleton(TimeProvider.System);
        services.AddSingleton(sp => new RedisConnection(options, sp.GetRequiredService<ILogger<RedisConnection>>()));
        services.AddHostedService<RedisConnectionStart>();
        services.TryAddSingleton(new RedisTileTierOptions());

        services.AddStackExchangeRedisCache(_ => { });
        services.AddOptions<RedisCacheOptions>().Configure<RedisConnection, RedisTileTierOptions>((cache, connection, tiles) =>
        {
            cache.ConnectionMultiplexerFactory = () => Task.FromResult(connection.Borrowed);
            cache.InstanceName = tiles.KeyPrefix;
        });
        services.AddSingleton<RedisTileTier>();
        services.AddSingleton<ISharedTileTier>(sp => sp.GetRequiredService<RedisTileTier>());
        return services;
    }
}
