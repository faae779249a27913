using Mosaic.Server.Hosting;
using Mosaic.TileCache;
using Mosaic.TileCache.Disk;
using Mosaic.TileCache.Throttling;

namespace Mosaic.Server.Tiles;

public static class TileServingServices
{
    /// <summary>The tile tiers (memory, disk under the cache folder's tiles/, and whatever shared tier is registered) and the render queue.</summary>
    public static IServiceCollection AddTileServing(this IServiceCollection services, MosaicOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        var tiles = options.Tiles;
        services.AddSingleton(new MemoryTileStoreOptions { CapacityBytes = (long)tiles.MemoryMegabytes << 20 });
        services.AddSingleton<ITileStore, MemoryTileStore>();
        if (tiles.DiskMegabytes > 0)
        {
            var disk = new DiskTileStoreOptions { Directory = Path.Combine(options.CacheDirectory, "tiles"), CapacityBytes = (long)tiles.DiskMegabytes << 20 };
            services.AddSingleton(sp => new DiskTileStore(disk, sp.GetService<ILogger<DiskTileStore>>()));
        }
        var queue = new RenderQueueOptions { ConcurrentRenders = tiles.RenderThreads, WaitingRenders = tiles.RenderQueue };
        services.AddSingleton(_ => new RenderQueue(queue));
        // The shared tier is optional: TileCacheService takes it when an ISharedTileTier is registered.
        services.AddSingleton<TileCacheService>();
        return services;
    }
}
