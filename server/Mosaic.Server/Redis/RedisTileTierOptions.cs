namespace Mosaic.Server.Redis;

/// <summary>How long shared tiles live and how little the tile path waits for Redis.</summary>
public sealed class RedisTileTierOptions
{
    /// <summary>A shared tile is dropped this long after it was written; tile keys are content-addressed, so this only bounds memory.</summary>
    public TimeSpan Expiry { get; init; } = TimeSpan.FromDays(1);

    /// <summary>A read or write slower than this counts as a failure; rendering locally is cheaper than waiting longer.</summary>
    public TimeSpan Timeout { get; init; } = TimeSpan.FromMilliseconds(500);

    /// <summary>After a failure the tier answers misses without asking Redis for this long, then tries one request.</summary>
    public TimeSpan RetryAfter { get; init; } = TimeSpan.FromSeconds(3);

    /// <summary>Prefix of every tile key in Redis, so other data in the same database is not touched.</summary>
    public string KeyPrefix { get; init; } = "mosaic:tile:";
}
