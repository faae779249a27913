namespace Mosaic.Server.Hosting;

/// <summary>Where the data and the cache live, read from the command line (--data, --cache, --demo-preset).</summary>
public sealed class MosaicOptions
{
    /// <summary>Each FITS file directly in it is a field; each sub-folder is a field whose files are its bands.</summary>
    public required string DataDirectory { get; init; }

    /// <summary>Pyramids and histograms are built here once and reused across restarts.</summary>
    public required string CacheDirectory { get; init; }

    /// <summary>True when no --data was given: the demo field is generated into DataDirectory if missing.</summary>
    public bool ServesDemo { get; init; }

    public string DemoPreset { get; init; } = "default";

    public static MosaicOptions FromConfiguration(IConfiguration configuration)
    {
        var data = configuration["data"];
        var cache = configuration["cache"] ?? Path.Combine(XdgFolder("XDG_CACHE_HOME", ".cache"), "mosaic");
        return new MosaicOptions
        {
            DataDirectory = Path.GetFullPath(data ?? Path.Combine(XdgFolder("XDG_DATA_HOME", Path.Combine(".local", "share")), "mosaic", "demo-data")),
            CacheDirectory = Path.GetFullPath(cache),
            ServesDemo = data is null,
            DemoPreset = configuration["demo-preset"] ?? "default",
        };
    }

    private static string XdgFolder(string variable, string fallbackUnderHome)
    {
        var value = Environment.GetEnvironmentVariable(variable);
        return string.IsNullOrEmpty(value)
            ? Path.Combine(Environment.GetFolderPath(Environment.SpecialFolder.UserProfile), fallbackUnderHome)
            : value;
    }
}
