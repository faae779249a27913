using Microsoft.Extensions.Configuration;
using Mosaic.Server.Hosting;

namespace Mosaic.Server.Tests.Memory;

/// <summary>
/// Which GC heap limit the server chooses from its options. The precedence is issue 8's rule (an operator's runtime
/// setting or --heap-limit-mb wins over the derived limit); the runtime setting names are those of the .NET GC
/// configuration documentation (DOTNET_GCHeapHardLimit and its percent and per-heap forms, the COMPlus_ prefix,
/// runtimeconfig.json's System.GC.HeapHardLimit...).
/// </summary>
public sealed class HeapLimitChoiceTests
{
    private static readonly Func<string, object?> NoRuntimeConfig = _ => null;
    private static readonly Func<string, string?> NoEnvironment = _ => null;

    [Fact]
    public void DefaultOptionsGiveTheTileTierPlusTheAllowanceForSmallObjects()
    {
        var (options, configuration) = Options();
        var limit = HeapLimit.Choose(options, configuration, NoEnvironment, NoRuntimeConfig);
        Assert.Equal(HeapLimitSource.Derived, limit.Source);
        var exports = options.Limits.Concurrency;
        Assert.Equal(options.Tiles.MemoryMegabytes + HeapLimit.WorkingAllowanceMegabytes, limit.SmallObjectMegabytes);
        Assert.Equal(exports * HeapLimit.LargeObjectsPerExportMegabytes, limit.LargeObjectMegabytes);
        Assert.Equal(HeapLimit.PinnedBaseMegabytes + exports * HeapLimit.PinnedPerExportMegabytes, limit.PinnedObjectMegabytes);
        Assert.Null(limit.TotalMegabytes);
        Assert.Equal(limit.SmallObjectMegabytes + limit.LargeObjectMegabytes + limit.PinnedObjectMegabytes, limit.Megabytes);
        // Issue 8's bound is on RSS under tile load, which lives on the small-object heap: the default memory tier
        // (96 MiB) and the allowance leave the runtime's own ~120 MiB of RSS (measured idle) within 400 MB.
        Assert.True(limit.SmallObjectMegabytes + 120 <= 381, $"small-object limit {limit.SmallObjectMegabytes} MiB");
    }

    [Fact]
    public void ALargerTileTierAndMoreExportsRaiseTheirHeaps()
    {
        var (options, configuration) = Options(("tile-memory-mb", "1000"), ("expensive-concurrency", "3"));
        var limit = HeapLimit.Choose(options, configuration, NoEnvironment, NoRuntimeConfig);
        Assert.Equal(HeapLimitSource.Derived, limit.Source);
        Assert.Equal(1000 + HeapLimit.WorkingAllowanceMegabytes, limit.SmallObjectMegabytes);
        Assert.Equal(3 * HeapLimit.LargeObjectsPerExportMegabytes, limit.LargeObjectMegabytes);
        Assert.Equal(HeapLimit.PinnedBaseMegabytes + 3 * HeapLimit.PinnedPerExportMegabytes, limit.PinnedObjectMegabytes);
    }

    [Theory]
    [InlineData("DOTNET_GCHeapHardLimit", "0x20000000")]
    [InlineData("COMPlus_GCHeapHardLimit", "20000000")]
    [InlineData("DOTNET_GCHeapHardLimitPercent", "0x1e")]
    [InlineData("DOTNET_GCHeapHardLimitSOH", "0x10000000")]
    [InlineData("COMPlus_GCHeapHardLimitPOHPercent", "5")]
    public void ALimitInTheEnvironmentWinsEvenOverTheOption(string variable, string value)
    {
        var (options, configuration) = Options(("heap-limit-mb", "300"));
        var limit = HeapLimit.Choose(options, configuration, name => name == variable ? value : null, NoRuntimeConfig);
        Assert.Equal(HeapLimitSource.Runtime, limit.Source);
        Assert.Null(limit.Megabytes);
    }

    [Theory]
    [InlineData("System.GC.HeapHardLimit")]
    [InlineData("System.GC.HeapHardLimitPercent")]
    [InlineData("System.GC.HeapHardLimitLOH")]
    public void ALimitInRuntimeConfigWins(string property)
    {
        var (options, configuration) = Options();
        var limit = HeapLimit.Choose(options, configuration, NoEnvironment, name => name == property ? (object)536870912UL : null);
        Assert.Equal(HeapLimitSource.Runtime, limit.Source);
        Assert.Null(limit.Megabytes);
    }

    [Fact]
    public void TheOptionSetsOneLimitForTheWholeHeap()
    {
        var (options, configuration) = Options(("heap-limit-mb", "300"), ("tile-memory-mb", "1000"));
        var limit = HeapLimit.Choose(options, configuration, NoEnvironment, NoRuntimeConfig);
        Assert.Equal(HeapLimitSource.Option, limit.Source);
        Assert.Equal(300, limit.TotalMegabytes);
        Assert.Equal(300, limit.Megabytes);
        Assert.Null(limit.SmallObjectMegabytes);
    }

    [Fact]
    public void ZeroLeavesTheGcItsOwnLimit()
    {
        var (options, configuration) = Options(("heap-limit-mb", "0"));
        var limit = HeapLimit.Choose(options, configuration, NoEnvironment, NoRuntimeConfig);
        Assert.Equal(HeapLimitSource.None, limit.Source);
        Assert.Null(limit.Megabytes);
    }

    [Theory]
    [InlineData("many")]
    [InlineData("-5")]
    [InlineData("63")]
    [InlineData("1048577")]
    [InlineData("1.5")]
    public void ABadOptionIsRefusedByName(string value)
    {
        var (options, configuration) = Options(("heap-limit-mb", value));
        var e = Assert.Throws<ArgumentException>(() => HeapLimit.Choose(options, configuration, NoEnvironment, NoRuntimeConfig));
        Assert.StartsWith("--heap-limit-mb must be", e.Message);
        Assert.Contains($"'{value}'", e.Message);
    }

    private static (MosaicOptions, IConfiguration) Options(params (string Key, string Value)[] settings)
    {
        var values = new Dictionary<string, string?> { ["data"] = Path.GetTempPath(), ["cache"] = Path.GetTempPath() };
        foreach (var (key, value) in settings) values[key] = value;
        var configuration = new ConfigurationBuilder().AddInMemoryCollection(values).Build();
        return (MosaicOptions.FromConfiguration(configuration), configuration);
    }
}
