namespace Mosaic.Server.Redis;

/// <summary>What /healthz says of Redis.</summary>
public enum RedisState
{
    /// <summary>No --redis given: everything is local to this instance.</summary>
    Off,

    /// <summary>Connected, and the shared tile tier is answering.</summary>
    Up,

    /// <summary>Configured but unreachable (or too slow): tiles come from this instance's own tiers.</summary>
    Down,
}
