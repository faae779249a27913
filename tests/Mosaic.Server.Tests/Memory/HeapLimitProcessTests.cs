using System.Globalization;
using System.Text.RegularExpressions;
using Mosaic.Server.Hosting;
using Mosaic.Server.Security;
using Mosaic.Server.Tiles;

namespace Mosaic.Server.Tests.Memory;

/// <summary>
/// The limit the GC of a started server reports. The server logs GCMemoryInfo.TotalAvailableMemoryBytes read back
/// from the runtime after GC.RefreshMemoryLimit, which that property reports as the heap hard limit once one is set
/// (.NET API documentation of GC.RefreshMemoryLimit and GCMemoryInfo); so these check that the runtime took the
/// limit, not only that Mosaic computed it.
/// </summary>
public sealed partial class HeapLimitProcessTests : IDisposable
{
    private static readonly TimeSpan StartLimit = TimeSpan.FromSeconds(90);
    private readonly string _work = Path.Combine(Path.GetTempPath(), $"mosaic-heap-{Guid.NewGuid():N}");

    public HeapLimitProcessTests() => Directory.CreateDirectory(Path.Combine(_work, "data"));

    [Fact]
    public async Task DefaultSettingsGiveTheDerivedLimit()
    {
        var exports = RequestLimits.Default.Concurrency;
        var expected = TileServingOptions.Default.MemoryMegabytes + HeapLimit.WorkingAllowanceMegabytes
            + exports * HeapLimit.LargeObjectsPerExportMegabytes + HeapLimit.PinnedBaseMegabytes + exports * HeapLimit.PinnedPerExportMegabytes;
        var line = await LimitLine([]);
        Assert.Equal(expected, Reported(line));
        Assert.Contains($"small objects {TileServingOptions.Default.MemoryMegabytes + HeapLimit.WorkingAllowanceMegabytes} MiB", line);
    }

    [Fact]
    public async Task ALargerTileTierRaisesTheLimitByAsMuch()
    {
        var standard = Reported(await LimitLine([]));
        var larger = await LimitLine(["--tile-memory-mb", "640"]);
        Assert.Equal(standard + 640 - TileServingOptions.Default.MemoryMegabytes, Reported(larger));
        Assert.Contains($"tile memory tier 640 + working allowance {HeapLimit.WorkingAllowanceMegabytes}", larger);
    }

    [Fact]
    public async Task TheOptionSetsTheLimit()
    {
        var line = await LimitLine(["--heap-limit-mb", "200"]);
        Assert.Equal(200, Reported(line));
        Assert.Contains("(--heap-limit-mb 200)", line);
    }

    [Fact]
    public async Task TheOperatorsRuntimeSettingWins()
    {
        // DOTNET_GCHeapHardLimit takes a hexadecimal byte count (.NET GC configuration documentation): 0x30000000 = 768 MiB.
        var line = await LimitLine(["--heap-limit-mb", "200"], new Dictionary<string, string?> { ["DOTNET_GCHeapHardLimit"] = "0x30000000" });
        Assert.Equal(768, Reported(line));
        Assert.Contains("set in the runtime's configuration", line);
    }

    [Fact]
    public void ABadOptionStopsTheServerNamingIt()
    {
        using var server = RealServer.Start(Arguments(["--heap-limit-mb", "12"]));
        Assert.True(server.WaitForExit(StartLimit), "the server kept running with --heap-limit-mb 12");
        Assert.NotEqual(0, server.ExitCode);
        Assert.Contains("--heap-limit-mb must be 0 (no limit) or a whole number of MiB from 64", server.Output);
    }

    public void Dispose()
    {
        try
        {
            Directory.Delete(_work, recursive: true);
        }
        catch (IOException)
        {
        }
    }

    private async Task<string> LimitLine(string[] arguments, IReadOnlyDictionary<string, string?>? environment = null)
    {
        using var server = RealServer.Start(Arguments(arguments), environment: environment);
        return await server.WaitForLineAsync(l => l.Contains("GC heap limit", StringComparison.Ordinal), StartLimit);
    }

    private string[] Arguments(string[] more) =>
    [
        "--data", Path.Combine(_work, "data"), "--cache", Path.Combine(_work, "cache"), "--state", Path.Combine(_work, $"state-{Guid.NewGuid():N}"),
        .. more,
    ];

    private static long Reported(string line)
    {
        var match = LimitPattern().Match(line);
        Assert.True(match.Success, $"no limit in '{line}'");
        return long.Parse(match.Groups[1].Value, CultureInfo.InvariantCulture);
    }

    [GeneratedRegex(@"GC heap limit (\d+) MiB")]
    private static partial Regex LimitPattern();
}
