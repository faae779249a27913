using System.Globalization;

namespace Mosaic.Server.Tiles;

/// <summary>
/// The tile caches' bounds and the render queue, read from --tile-memory-mb, --tile-disk-mb, --render-threads and
/// --render-queue. The defaults keep the server's memory within a few hundred MB whatever the data size: the memory
/// tier is the only cache held in RAM, and at most one render a core is in flight.
/// </summary>
public sealed record TileServingOptions
{
    public const int MaxMegabytes = 1 << 20;

    /// <summary>Bound on the encoded tiles kept in memory, in MiB.</summary>
    public int MemoryMegabytes { get; init; } = 96;

    /// <summary>Bound on the tile files under the cache folder's tiles/, in MiB; 0 for no disk tier.</summary>
    public int DiskMegabytes { get; init; } = 2048;

    /// <summary>Tiles (and render.png images) rendered at once.</summary>
    public int RenderThreads { get; init; } = Environment.ProcessorCount;

    /// <summary>Renders that may wait for a free thread; beyond them a request gets 429.</summary>
    public int RenderQueue { get; init; } = 256;

    public static TileServingOptions Default { get; } = new();

    public static TileServingOptions FromConfiguration(IConfiguration configuration)
    {
        ArgumentNullException.ThrowIfNull(configuration);
        return new TileServingOptions
        {
            MemoryMegabytes = Whole(configuration, "tile-memory-mb", Default.MemoryMegabytes, 1, MaxMegabytes, "MiB"),
            DiskMegabytes = Whole(configuration, "tile-disk-mb", Default.DiskMegabytes, 0, MaxMegabytes, "MiB (0 for no disk tier)"),
            RenderThreads = Whole(configuration, "render-threads", Default.RenderThreads, 1, 1024, "renders at once"),
            RenderQueue = Whole(configuration, "render-queue", Default.RenderQueue, 0, 100_000, "waiting renders"),
        };
    }

    private static int Whole(IConfiguration configuration, string name, int fallback, int least, int most, string unit)
    {
        var text = configuration[name];
        if (string.IsNullOrWhiteSpace(text)) return fallback;
        if (!int.TryParse(text.Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out var value) || value < least || value > most)
            throw new ArgumentException($"--{name} must be a whole number from {least} to {most} ({unit}); got '{text}'.");
        return value;
    }
}
