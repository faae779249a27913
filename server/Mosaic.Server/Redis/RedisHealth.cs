namespace Mosaic.Server.Redis;

/// <summary>The Redis state /healthz reports, from what the multiplexer and the tile tier already know: no round trip.</summary>
public static class RedisHealth
{
    public static RedisState StateOf(IServiceProvider services)
    {
        if (services.GetService<RedisConnection>() is not { } connection) return RedisState.Off;
        if (!connection.IsConnected) return RedisState.Down;
        return services.GetService<RedisTileTier>() is { Circuit.IsOpen: true } ? RedisState.Down : RedisState.Up;
    }

    /// <summary>The word for it in JSON: off, up or down.</summary>
    public static string Name(RedisState state) => state switch
    {
        RedisState.Off => "off",
        RedisState.Up => "up",
        _ => "down",
    };
}
