namespace Mosaic.Server.Hosting;

/// <summary>Writes the heap limit to the log once the host starts (at Information, under Mosaic.Server.Hosting).</summary>
public sealed class HeapLimitReport(HeapLimit limit, long reportedBytes, ILogger<HeapLimitReport> logger) : IHostedService
{
    public Task StartAsync(CancellationToken cancellationToken)
    {
        logger.LogInformation("{HeapLimit}", limit.Describe(reportedBytes));
        return Task.CompletedTask;
    }

    public Task StopAsync(CancellationToken cancellationToken) => Task.CompletedTask;
}
