using System.Globalization;

namespace Mosaic.Server.Hosting;

/// <summary>
/// The GC heap's hard limits, chosen once at start. Without them the workstation GC lets tiles evicted from the
/// memory tier (old-generation garbage on the small-object heap) pile up with the request rate until RSS is several
/// times the live set; a limit on the small-object heap makes it collect them instead. That heap gets the memory
/// tier plus a working allowance, so a larger --tile-memory-mb raises it with it. The large-object heap (arrays of
/// 1 MiB and more: render.png and cutout buffers) and the pinned heap (Kestrel's response buffers) get reserves
/// sized to the largest export times the exports allowed at once, so a capped export never fails for memory.
/// DEVELOPERS.md, "Memory model".
/// </summary>
/// <param name="SmallObjectMegabytes">GCHeapHardLimitSOH in MiB (derived limits only).</param>
/// <param name="LargeObjectMegabytes">GCHeapHardLimitLOH in MiB (derived limits only).</param>
/// <param name="PinnedObjectMegabytes">GCHeapHardLimitPOH in MiB (derived limits only).</param>
/// <param name="TotalMegabytes">GCHeapHardLimit in MiB (--heap-limit-mb only).</param>
public sealed record HeapLimit(HeapLimitSource Source, long? SmallObjectMegabytes = null, long? LargeObjectMegabytes = null,
    long? PinnedObjectMegabytes = null, long? TotalMegabytes = null)
{
    /// <summary>
    /// MiB of small-object heap besides the tile memory tier: framework, connections and hubs, the disk tier's index,
    /// compiled displays below 1 MiB, render buffers of tiles in flight, and the GC's headroom (measured: DEVELOPERS.md).
    /// </summary>
    public const long WorkingAllowanceMegabytes = 96;

    /// <summary>
    /// MiB of large-object heap for each export allowed at once (--expensive-concurrency), plus tables of 1 MiB and
    /// more. Measured: a 50 Mpx RGB render.png takes about 1 GB (its PNG grown by doubling, then copied out), and
    /// five 50 Mpx renders in a row (gray and RGB) 1.8-2 GB of RSS, as the shared array pool keeps the grown
    /// buffers; with 1 GiB an RGB one failed.
    /// </summary>
    public const long LargeObjectsPerExportMegabytes = 2048;

    /// <summary>MiB of pinned heap besides the exports: Kestrel's pinned blocks for the responses of every connection.</summary>
    public const long PinnedBaseMegabytes = 64;

    /// <summary>
    /// MiB of pinned heap for each export at once: what Kestrel holds of its response (render.png and cutouts are
    /// written a slice or strip at a time, 256 KiB to 1 MiB, each awaited).
    /// </summary>
    public const long PinnedPerExportMegabytes = 16;

    /// <summary>Smallest --heap-limit-mb accepted (besides 0): a floor; smaller limits were not tried.</summary>
    public const long LeastMegabytes = 64;

    /// <summary>Largest --heap-limit-mb accepted: 1 TiB.</summary>
    public const long MostMegabytes = 1L << 20;

    // The runtime's own ways of setting a hard limit: environment (DOTNET_ or the older COMPlus_ prefix) and
    // runtimeconfig.json (System.GC.*), as the runtime's GC configuration documentation lists them.
    private static readonly string[] RuntimeSettings =
    [
        "HeapHardLimit", "HeapHardLimitPercent", "HeapHardLimitSOH", "HeapHardLimitLOH", "HeapHardLimitPOH",
        "HeapHardLimitSOHPercent", "HeapHardLimitLOHPercent", "HeapHardLimitPOHPercent",
    ];

    /// <summary>The sum of the limits Mosaic sets, in MiB; null when it sets none.</summary>
    public long? Megabytes => TotalMegabytes ?? SmallObjectMegabytes + LargeObjectMegabytes + PinnedObjectMegabytes;

    /// <summary>
    /// The limit for these options: a limit the runtime was given wins, then --heap-limit-mb (0: none), else the
    /// derived per-heap limits. Throws <see cref="ArgumentException"/> for a bad --heap-limit-mb.
    /// </summary>
    /// <param name="environment">The process's environment variables (name to value).</param>
    /// <param name="runtimeProperty">Reads a runtimeconfig property (AppContext.GetData).</param>
    public static HeapLimit Choose(MosaicOptions options, IConfiguration configuration,
        Func<string, string?> environment, Func<string, object?> runtimeProperty)
    {
        ArgumentNullException.ThrowIfNull(options);
        ArgumentNullException.ThrowIfNull(configuration);
        ArgumentNullException.ThrowIfNull(environment);
        ArgumentNullException.ThrowIfNull(runtimeProperty);
        var option = OptionMegabytes(configuration["heap-limit-mb"]);
        if (RuntimeHasLimit(environment, runtimeProperty)) return new HeapLimit(HeapLimitSource.Runtime);
        var exports = options.Limits.Concurrency;
        return option switch
        {
            0 => new HeapLimit(HeapLimitSource.None),
            { } megabytes => new HeapLimit(HeapLimitSource.Option, TotalMegabytes: megabytes),
            null => new HeapLimit(HeapLimitSource.Derived,
                SmallObjectMegabytes: options.Tiles.MemoryMegabytes + WorkingAllowanceMegabytes,
                LargeObjectMegabytes: exports * LargeObjectsPerExportMegabytes,
                PinnedObjectMegabytes: PinnedBaseMegabytes + exports * PinnedPerExportMegabytes),
        };
    }

    /// <summary>The limit for this process's environment and runtimeconfig.</summary>
    public static HeapLimit Choose(MosaicOptions options, IConfiguration configuration) =>
        Choose(options, configuration, Environment.GetEnvironmentVariable, AppContext.GetData);

    /// <summary>
    /// Gives the GC these limits (AppContext "GCHeapHardLimit..." values, then GC.RefreshMemoryLimit, as the
    /// GC.RefreshMemoryLimit documentation describes); nothing where <see cref="Megabytes"/> is null. Returns the
    /// limit the GC reports afterwards (GCMemoryInfo.TotalAvailableMemoryBytes).
    /// </summary>
    public long Apply()
    {
        if (Megabytes is null) return GC.GetGCMemoryInfo().TotalAvailableMemoryBytes;
        if (TotalMegabytes is { } total) AppContext.SetData("GCHeapHardLimit", (ulong)total << 20);
        else
        {
            AppContext.SetData("GCHeapHardLimitSOH", (ulong)SmallObjectMegabytes!.Value << 20);
            AppContext.SetData("GCHeapHardLimitLOH", (ulong)LargeObjectMegabytes!.Value << 20);
            AppContext.SetData("GCHeapHardLimitPOH", (ulong)PinnedObjectMegabytes!.Value << 20);
        }
        try
        {
            GC.RefreshMemoryLimit();
        }
        catch (InvalidOperationException e)
        {
            throw new InvalidOperationException(
                $"The GC heap limit of {Megabytes} MiB ({Source}) is below what the heap already holds: raise --heap-limit-mb or --tile-memory-mb.", e);
        }
        return GC.GetGCMemoryInfo().TotalAvailableMemoryBytes;
    }

    /// <summary>A line for the start-up log.</summary>
    public string Describe(long reportedBytes) => Source switch
    {
        HeapLimitSource.Runtime => $"GC heap limit {reportedBytes >> 20} MiB, set in the runtime's configuration",
        HeapLimitSource.Host => $"GC heap limit {reportedBytes >> 20} MiB, the hosting process's own",
        HeapLimitSource.None => $"GC heap limit: none from Mosaic (--heap-limit-mb 0); the GC allows {reportedBytes >> 20} MiB",
        HeapLimitSource.Option => $"GC heap limit {reportedBytes >> 20} MiB (--heap-limit-mb {TotalMegabytes})",
        _ => $"GC heap limit {reportedBytes >> 20} MiB: small objects {SmallObjectMegabytes} MiB (tile memory tier {SmallObjectMegabytes - WorkingAllowanceMegabytes} "
            + $"+ working allowance {WorkingAllowanceMegabytes}), large objects {LargeObjectMegabytes} MiB, pinned {PinnedObjectMegabytes} MiB",
    };

    private static long? OptionMegabytes(string? text)
    {
        if (string.IsNullOrWhiteSpace(text)) return null;
        if (!long.TryParse(text.Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out var value)
            || (value != 0 && (value < LeastMegabytes || value > MostMegabytes)))
            throw new ArgumentException($"--heap-limit-mb must be 0 (no limit) or a whole number of MiB from {LeastMegabytes} to {MostMegabytes}; got '{text}'.");
        return value;
    }

    private static bool RuntimeHasLimit(Func<string, string?> environment, Func<string, object?> runtimeProperty)
    {
        foreach (var name in RuntimeSettings)
        {
            if (!string.IsNullOrWhiteSpace(environment("DOTNET_GC" + name)) || !string.IsNullOrWhiteSpace(environment("COMPlus_GC" + name)))
                return true;
            if (runtimeProperty("System.GC." + name) is { } value && !string.IsNullOrWhiteSpace(Convert.ToString(value, CultureInfo.InvariantCulture)))
                return true;
        }
        return false;
    }
}
