using Microsoft.Extensions.Configuration;
using Mosaic.Server.Tiles;

namespace Mosaic.Server.Tests.TileServing;

public sealed class TileServingOptionsTests
{
    private static TileServingOptions Read(params (string Name, string Value)[] settings) =>
        TileServingOptions.FromConfiguration(new ConfigurationBuilder()
            .AddInMemoryCollection(settings.Select(s => new KeyValuePair<string, string?>(s.Name, s.Value))).Build());

    [Fact]
    public void Defaults_are_the_documented_ones()
    {
        var options = Read();
        Assert.Equal(96, options.MemoryMegabytes);
        Assert.Equal(2048, options.DiskMegabytes);
        Assert.Equal(Environment.ProcessorCount, options.RenderThreads);
        Assert.Equal(256, options.RenderQueue);
    }

    [Fact]
    public void Reads_each_option()
    {
        var options = Read(("tile-memory-mb", "64"), ("tile-disk-mb", "0"), ("render-threads", "3"), ("render-queue", " 10 "));
        Assert.Equal(64, options.MemoryMegabytes);
        Assert.Equal(0, options.DiskMegabytes);
        Assert.Equal(3, options.RenderThreads);
        Assert.Equal(10, options.RenderQueue);
    }

    [Theory]
    [InlineData("tile-memory-mb", "0")]
    [InlineData("tile-memory-mb", "lots")]
    [InlineData("tile-memory-mb", "1.5")]
    [InlineData("tile-disk-mb", "-1")]
    [InlineData("tile-disk-mb", "99999999999")]
    [InlineData("render-threads", "0")]
    [InlineData("render-queue", "-3")]
    public void Rejects_a_bad_value_naming_the_option(string name, string value)
    {
        var error = Assert.Throws<ArgumentException>(() => Read((name, value)));
        Assert.Contains($"--{name}", error.Message);
        Assert.Contains($"'{value}'", error.Message);
    }
}
