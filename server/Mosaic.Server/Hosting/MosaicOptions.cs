namespace Mosaic.Server.Hosting;

/// <summary>Where the data, the cache and the saved state live, read from the command line (--data, --cache, --state, --demo-preset, --cutout-limit).</summary>
public sealed class MosaicOptions
{
    /// <summary>Each FITS file directly in it is a field; each sub-folder is a field whose files are its bands.</summary>
    public required string DataDirectory { get; init; }

    /// <summary>Pyramids and histograms are built here once and reused across restarts.</summary>
    public required string CacheDirectory { get; init; }

    /// <summary>True when no --data was given: the demo field is generated into DataDirectory if missing.</summary>
    public bool ServesDemo { get; init; }

    public string DemoPreset { get; init; } = "default";

    /// <summary>Saved views (views.db) and other state that must outlive a restart; created on start.</summary>
    public string StateDirectory { get; init; } = Path.Combine(XdgFolder("XDG_DATA_HOME", Path.Combine(".local", "share")), "mosaic", "state");

    /// <summary>The largest FITS cutout served, in pixels (64 Mpx unless --cutout-limit says otherwise).</summary>
    public long CutoutPixelLimit { get; init; } = DefaultCutoutPixelLimit;

    public const long DefaultCutoutPixelLimit = 64L << 20;

    /// <summary>--redis host:port[,name=value...]: Redis shared by several instances (tiles, meetings, hub messages); null for none.</summary>
    public string? Redis { get; init; }

    /// <summary>Rate limits and the render timeout of the expensive endpoints (--expensive-rate, --expensive-burst, --expensive-concurrency, --render-timeout).</summary>
    public Security.RequestLimits Limits { get; init; } = Security.RequestLimits.Default;

    /// <summary>Tile cache bounds and the render queue (--tile-memory-mb, --tile-disk-mb, --render-threads, --render-queue).</summary>
    public Mosaic.Server.Tiles.TileServingOptions Tiles { get; init; } = Mosaic.Server.Tiles.TileServingOptions.Default;

    /// <summary>Access tokens, private fields and allowed origins (--access-token-file, MOSAIC_ACCESS_TOKEN, --anonymous, --private-fields, --allowed-origins).</summary>
    public Mosaic.Server.Access.AccessOptions Access { get; init; } = new();

    public static MosaicOptions FromConfiguration(IConfiguration configuration)
    {
        var data = configuration["data"];
        var cache = configuration["cache"] ?? Path.Combine(XdgFolder("XDG_CACHE_HOME", ".cache"), "mosaic");
        var state = configuration["state"] ?? Path.Combine(XdgFolder("XDG_DATA_HOME", Path.Combine(".local", "share")), "mosaic", "state");
        var preset = DemoPresetFrom(configuration["demo-preset"]);
        return new MosaicOptions
        {
            DataDirectory = Path.GetFullPath(data ?? Path.Combine(XdgFolder("XDG_DATA_HOME", Path.Combine(".local", "share")), "mosaic", DemoDataFolder(preset))),
            CacheDirectory = Path.GetFullPath(cache),
            ServesDemo = data is null,
            DemoPreset = preset,
            StateDirectory = Path.GetFullPath(state),
            CutoutPixelLimit = CutoutLimit(configuration["cutout-limit"]),
            Access = Mosaic.Server.Access.AccessOptions.FromConfiguration(configuration),
            Redis = string.IsNullOrWhiteSpace(configuration["redis"]) ? null : configuration["redis"]!.Trim(),
            Limits = Security.RequestLimits.FromConfiguration(configuration),
            Tiles = Mosaic.Server.Tiles.TileServingOptions.FromConfiguration(configuration),
        };
    }

    private static string DemoPresetFrom(string? text)
    {
        var preset = string.IsNullOrWhiteSpace(text) ? "default" : text.Trim();
        if (!DemoField.Presets.Contains(preset))
            throw new ArgumentException($"--demo-preset must be {DemoField.PresetChoices}; got '{text}'.");
        return preset;
    }

    // One folder a preset, so asking for another preset generates it rather than serving the one already there.
    private static string DemoDataFolder(string preset) => preset == "default" ? "demo-data" : $"demo-data-{preset}";

    private static long CutoutLimit(string? text)
    {
        if (string.IsNullOrWhiteSpace(text)) return DefaultCutoutPixelLimit;
        if (!long.TryParse(text.Trim(), System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out var limit) || limit < 1)
            throw new ArgumentException($"--cutout-limit must be a whole number of pixels, at least 1; got '{text}'.");
        return limit;
    }

    private static string XdgFolder(string variable, string fallbackUnderHome)
    {
        var value = Environment.GetEnvironmentVariable(variable);
        return string.IsNullOrEmpty(value)
            ? Path.Combine(Environment.GetFolderPath(Environment.SpecialFolder.UserProfile), fallbackUnderHome)
            : value;
    }
}
