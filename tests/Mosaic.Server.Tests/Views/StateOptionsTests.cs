using Microsoft.Extensions.Configuration;
using Mosaic.Server.Hosting;

namespace Mosaic.Server.Tests.Views;

/// <summary>--state, --cutout-limit and --demo-preset as MosaicOptions reads them.</summary>
public sealed class StateOptionsTests
{
    private static MosaicOptions Read(params (string Key, string Value)[] settings) =>
        MosaicOptions.FromConfiguration(new ConfigurationBuilder()
            .AddInMemoryCollection(settings.Select(s => new KeyValuePair<string, string?>(s.Key, s.Value))).Build());

    [Fact]
    public void StateFolderAndCutoutLimitComeFromTheCommandLine()
    {
        var options = Read(("state", "/tmp/some/state"), ("cutout-limit", "1000"));
        Assert.Equal("/tmp/some/state", options.StateDirectory);
        Assert.Equal(1000, options.CutoutPixelLimit);
    }

    [Fact]
    public void DefaultsAreUnderTheDataHomeAnd64Megapixels()
    {
        var options = Read();
        // XDG Base Directory specification: $XDG_DATA_HOME, else ~/.local/share.
        var home = Environment.GetEnvironmentVariable("XDG_DATA_HOME") is { Length: > 0 } xdg
            ? xdg : Path.Combine(Environment.GetFolderPath(Environment.SpecialFolder.UserProfile), ".local", "share");
        Assert.Equal(Path.GetFullPath(Path.Combine(home, "mosaic", "state")), options.StateDirectory);
        Assert.Equal(64L * 1024 * 1024, options.CutoutPixelLimit);
    }

    [Theory]
    [InlineData("0")]
    [InlineData("-5")]
    [InlineData("lots")]
    public void ABadCutoutLimitStopsTheStart(string value)
    {
        var error = Assert.Throws<ArgumentException>(() => Read(("cutout-limit", value)));
        Assert.Contains("--cutout-limit", error.Message);
    }

    [Fact]
    public void EachDemoPresetHasItsOwnFolderSoAnotherPresetIsNotServedInItsPlace()
    {
        var folders = new[] { "small", "default", "large" }.Select(preset => Read(("demo-preset", preset))).ToList();
        Assert.All(folders, options => Assert.True(options.ServesDemo));
        Assert.Equal(["small", "default", "large"], folders.Select(o => o.DemoPreset));
        Assert.Equal(3, folders.Select(o => o.DataDirectory).Distinct().Count());
        // The default preset keeps the folder the README names.
        Assert.Equal(Read().DataDirectory, folders[1].DataDirectory);
        Assert.EndsWith(Path.Combine("mosaic", "demo-data"), folders[1].DataDirectory);
    }

    [Fact]
    public void AnUnknownDemoPresetStopsTheStartLikeAnyBadOption()
    {
        var error = Assert.Throws<ArgumentException>(() => Read(("demo-preset", "huge")));
        Assert.Contains("--demo-preset", error.Message);
        Assert.Contains("'huge'", error.Message);
        Assert.True(ServerArguments.IsOptionError(error));
    }
}
