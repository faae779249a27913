using System.Net;
using Microsoft.Extensions.DependencyInjection;
using Mosaic.TileCache.Disk;

namespace Mosaic.Server.Tests.TileServing;

public sealed class DiskTierEndpointTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>
{
    [Fact]
    public async Task Tiles_rendered_before_a_restart_come_from_the_disk_tier_after_it()
    {
        var cache = data.NewCacheDirectory();
        byte[] rendered;
        string etag;
        using (var first = new TileServingFactory(data.DataDirectory, cache))
        using (var client = first.CreateClient())
        {
            await MosaicFactory.WaitForPyramidsAsync(client, "single");
            var answer = await client.GetAsync("/tiles/single/2/1/1.png?stretch=sqrt");
            Assert.Equal("rendered", Assert.Single(answer.Headers.GetValues("X-Tile-Cache")));
            rendered = await answer.Content.ReadAsByteArrayAsync();
            etag = answer.Headers.ETag!.Tag;
            // The disk tier takes a tile on its second ask (the first is answered from memory).
            Assert.False(Directory.Exists(Path.Combine(cache, "tiles"))
                && Directory.EnumerateFiles(Path.Combine(cache, "tiles"), "*.tile", SearchOption.AllDirectories).Any());
            var second = await client.GetAsync("/tiles/single/2/1/1.png?stretch=sqrt");
            Assert.Equal("memory", Assert.Single(second.Headers.GetValues("X-Tile-Cache")));
            var disk = first.Services.GetRequiredService<DiskTileStore>();
            Assert.Equal(2048L << 20, disk.CapacityBytes); // the documented default, 2048 MiB
        }
        Assert.NotEmpty(Directory.EnumerateFiles(Path.Combine(cache, "tiles"), "*.tile", SearchOption.AllDirectories));

        using (var second = new TileServingFactory(data.DataDirectory, cache))
        using (var client = second.CreateClient())
        {
            var answer = await client.GetAsync("/tiles/single/2/1/1.png?stretch=sqrt");
            Assert.Equal(HttpStatusCode.OK, answer.StatusCode);
            Assert.Equal("disk", Assert.Single(answer.Headers.GetValues("X-Tile-Cache")));
            Assert.Equal(rendered, await answer.Content.ReadAsByteArrayAsync());
            Assert.Equal(etag, answer.Headers.ETag!.Tag); // the ETag follows from the key alone, so it survives the restart
            var again = await client.GetAsync("/tiles/single/2/1/1.png?stretch=sqrt");
            Assert.Equal("memory", Assert.Single(again.Headers.GetValues("X-Tile-Cache")));
        }
    }

    [Fact]
    public async Task A_disk_bound_of_zero_keeps_no_tiles_on_disk()
    {
        var cache = data.NewCacheDirectory();
        using var factory = new TileServingFactory(data.DataDirectory, cache, ("tile-disk-mb", "0"), ("tile-memory-mb", "16"));
        using var client = factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(client, "single");
        Assert.Null(factory.Services.GetService<DiskTileStore>());

        Assert.Equal("rendered", Assert.Single((await client.GetAsync("/tiles/single/0/0/0.png")).Headers.GetValues("X-Tile-Cache")));
        Assert.Equal("memory", Assert.Single((await client.GetAsync("/tiles/single/0/0/0.png")).Headers.GetValues("X-Tile-Cache")));
        Assert.False(Directory.Exists(Path.Combine(cache, "tiles")));
    }
}
