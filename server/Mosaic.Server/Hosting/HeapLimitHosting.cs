namespace Mosaic.Server.Hosting;

/// <summary>Applies the GC heap limit before the host is built and reports it in the start-up log.</summary>
public static class HeapLimitHosting
{
    public static WebApplicationBuilder UseHeapLimit(this WebApplicationBuilder builder, MosaicOptions options)
    {
        ArgumentNullException.ThrowIfNull(builder);
        ArgumentNullException.ThrowIfNull(options);
        // The limit is the whole process's: only the server's own process sets it, not a host embedded in another one.
        var limit = System.Reflection.Assembly.GetEntryAssembly() == typeof(HeapLimitHosting).Assembly
            ? HeapLimit.Choose(options, builder.Configuration)
            : new HeapLimit(HeapLimitSource.Host);
        // Before the host allocates its caches, so nothing committed yet exceeds the limit.
        var reported = limit.Apply();
        builder.Services.AddSingleton(limit);
        builder.Services.AddHostedService(sp => new HeapLimitReport(limit, reported, sp.GetRequiredService<ILogger<HeapLimitReport>>()));
        return builder;
    }
}
