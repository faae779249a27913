using Mosaic.Server.Access;
using Mosaic.Server.ClientFiles;
using Mosaic.Server.Endpoints;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Meetings;
using Mosaic.Server.Pyramids;
using Mosaic.Server.Redis;
using Mosaic.Server.Regions;
using Mosaic.Server.Security;
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
        services.AddRequestLimits(options.Limits);
        services.AddOpenApi();
        services.AddSingleton<FieldCatalog>();
        services.AddSingleton<PyramidService>();
        services.AddHostedService(sp => sp.GetRequiredService<PyramidService>());
        services.AddTileServing(options);
        services.AddSingleton<DisplayCompiler>();
        services.AddSingleton<TileService>();
        services.AddSingleton<RegionImageService>();
        services.AddSingleton<RegionStatisticsService>();
        services.AddSingleton<ViewStore>();
        services.AddMosaicAccess(options);
        if (options.Redis is not null) services.AddMosaicRedis(options.Redis);
        services.AddMeetings(sharedOverRedis: options.Redis is not null);
        return services;
    }

    public static WebApplication UseMosaic(this WebApplication app)
    {
        app.UseRedactedRequestLog();
        app.UseExceptionHandler();
        app.UseStatusCodePages();
        // Security order: headers first, so every answer (errors and refusals too) carries them; access checks (token,
        // Origin) belong next; then the query's shape, the rate limits and the render timeouts, cheapest refusal first.
        app.UseMiddleware<SecurityHeaders>();
        app.UseMosaicAccess();
        app.UseMiddleware<QueryGuard>();
        app.UseRateLimiter();
        app.UseRequestTimeouts();
        app.UseClientFiles();
        app.MapOpenApi();
        app.MapHealthEndpoints();
        app.MapFieldEndpoints().AddEndpointFilter<VisibleFieldsFilter>();
        app.MapSkyEndpoints();
        app.MapTileEndpoints();
        app.MapStatisticsEndpoints();
        app.MapDisplayEndpoints();
        app.MapRenderEndpoints();
        app.MapViewEndpoints();
        app.MapCutoutEndpoints();
        app.MapMeetingEndpoints();
        app.MapMeetingHub();
        app.MapSignInEndpoints();
        app.MapAccessEndpoints();
        app.LogAccessSummary();

        // Scan at start so the pyramids begin building before anyone asks.
        app.Lifetime.ApplicationStarted.Register(() => app.Services.GetRequiredService<FieldCatalog>().RefreshIfStale());
        return app;
    }
}
