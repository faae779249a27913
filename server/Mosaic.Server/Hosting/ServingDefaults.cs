namespace Mosaic.Server.Hosting;

/// <summary>Host settings that keep the per-request cost of serving a tile low.</summary>
public static class ServingDefaults
{
    // The framework's per-request Information logs (request start, endpoint, request end: four console lines a tile)
    // cost more than serving a cached tile. Warnings and errors still show; the configuration can say otherwise
    // (Logging:LogLevel:Microsoft.AspNetCore).
    private const string FrameworkCategory = "Microsoft.AspNetCore";

    public static WebApplicationBuilder UseServingDefaults(this WebApplicationBuilder builder)
    {
        ArgumentNullException.ThrowIfNull(builder);
        if (builder.Configuration[$"Logging:LogLevel:{FrameworkCategory}"] is null)
            builder.Logging.AddFilter(FrameworkCategory, LogLevel.Warning);
        builder.WebHost.ConfigureKestrel(kestrel => kestrel.AddServerHeader = false);
        return builder;
    }
}
