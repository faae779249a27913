namespace Mosaic.Server.Redis;

/// <summary>
/// Connects the shared Redis connection when the host starts. A hosted service of its own, not the connection
/// itself: the container also disposes what a hosted-service factory returns, so the connection was disposed twice.
/// </summary>
public sealed class RedisConnectionStart(RedisConnection connection) : IHostedService
{
    public Task StartAsync(CancellationToken cancellationToken) => connection.StartAsync(cancellationToken);

    public Task StopAsync(CancellationToken cancellationToken) => Task.CompletedTask;
}
