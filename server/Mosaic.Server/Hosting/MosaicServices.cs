using Mosaic.Server.Endpoints;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Meetings;
using Mosaic.Server.Pyramids;
using Mosaic.Server.Regions;
using Mosaic.Server.Rendering;
using Mosaic.Server.Tiles;
using Mosaic.Server.Views;
using Mosaic.TileCache;

namespace Mosaic.Server.Hosting;

public static class MosaicServices
{
    public static IServiceCollection AddMosaic(this IServiceCollection services, MosaicOptions options)
    {
        services.AddSingleton(options);
        services.AddProblemDetails();
        services.AddExceptionHandler<ProblemExceptionHandler>();
        services.AddOpenApi();
        services.AddSingleton<FieldCatalog>();
        services.AddSingleton<PyramidService>();
        services.AddHostedService(sp => sp.GetRequiredService<PyramidService>());
        services.AddSingleton(new MemoryTileStoreOptions());
        services.AddSingleton<ITileStore, MemoryTileStore>();
        services.AddSingleton<TileCacheService>();
        services.AddSingleton<DisplayCompiler>();
        services.AddSingleton<TileService>();
        services.AddSingleton<RegionImageService>();
        services.AddSingleton<RegionStatisticsService>();
        services.AddSingleton<ViewStore>();
        services.AddMeetings();
        return services;
    }

    public static WebApplication UseMosaic(this WebApplication app)
    {
        app.UseExceptionHandler();
        app.UseStatusCodePages();
        app.UseDefaultFiles();
        app.UseStaticFiles();
        app.MapOpenApi();
        app.MapHealthEndpoints();
        app.MapFieldEndpoints();
        app.MapSkyEndpoints();
        app.MapTileEndpoints();
        app.MapStatisticsEndpoints();
        app.MapDisplayEndpoints();
        app.MapRenderEndpoints();
        app.MapViewEndpoints();
        app.MapCutoutEndpoints();
        app.MapMeetingEndpoints();
        app.MapMeetingHub();

        // Scan at start so the pyramids begin building before anyone asks.
        app.Lifetime.ApplicationStarted.Register(() => app.Services.GetRequiredService<FieldCatalog>().RefreshIfStale());
        return app;
    }
}
