using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Server.Tests;

public sealed class TileEndpointTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>
{
    // ImageSharp 2.1.13 is the outside PNG decoder for every check here.
    private static async Task<Image<Rgba32>> GetTileAsync(HttpClient client, string url)
    {
        var response = await client.GetAsync(url);
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        Assert.Equal("image/png", response.Content.Headers.ContentType?.MediaType);
        var image = Image.Load<Rgba32>(await response.Content.ReadAsByteArrayAsync());
        Assert.Equal(256, image.Width);
        Assert.Equal(256, image.Height);
        return image;
    }

    private static double MeanGray(Image<Rgba32> image, int x0, int y0, int size)
    {
        double sum = 0;
        for (var y = y0; y < y0 + size; y++)
            for (var x = x0; x < x0 + size; x++)
                sum += image[x, y].R;
        return sum / (size * size);
    }

    [Fact]
    public async Task Native_tiles_put_the_highest_FITS_y_at_the_top_and_masked_pixels_are_transparent()
    {
        using var factory = new MosaicFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(client, "single");

        // single.fits has a bright block at FITS x 1..40, y 261..300: the top-left corner on screen (north up).
        using var topLeft = await GetTileAsync(client, "/tiles/single/2/0/0.png");
        Assert.True(MeanGray(topLeft, 5, 5, 30) > 250, "the bright block shows at the top-left");
        Assert.True(MeanGray(topLeft, 100, 100, 50) < 200, "the sky beside it is darker");
        Assert.Equal(255, topLeft[100, 100].A);

        // The BLANK pixel at FITS (21, 11) is 289 rows from the top: tile row 1, in-tile row 33, column 20.
        using var lower = await GetTileAsync(client, "/tiles/single/2/0/1.png");
        Assert.Equal(0, lower[20, 33].A);
        Assert.Equal(255, lower[21, 33].A);
        // Rows-from-top 300.. lie outside the 300-row image: transparent.
        Assert.Equal(0, lower[100, 300 - 256].A);
        Assert.Equal(255, lower[100, 300 - 256 - 1].A);
    }

    [Fact]
    public async Task Zoom_0_holds_the_whole_image_in_one_tile()
    {
        using var factory = new MosaicFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(client, "single");
        // 600 x 300 reduced 4x is 150 x 75 pixels in the top-left of the tile; the rest is outside.
        using var tile = await GetTileAsync(client, "/tiles/single/0/0/0.png");
        Assert.Equal(255, tile[149, 74].A);
        Assert.Equal(0, tile[150, 10].A);
        Assert.Equal(0, tile[10, 75].A);
        Assert.True(MeanGray(tile, 1, 1, 8) > 250, "the bright block (top-left 40 x 40 native) survives the 4x reduction");
    }

    [Fact]
    public async Task Limits_are_field_wide_so_a_brighter_chip_renders_brighter()
    {
        using var factory = new MosaicFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(client, "trio");
        // CCD1 is sky of mean 50, CCD2 of mean 100 (same band): per-tile limits would make them look alike.
        using var faint = await GetTileAsync(client, "/tiles/trio/1/0/0.png?band=red&hdu=CCD1");
        using var bright = await GetTileAsync(client, "/tiles/trio/1/0/0.png?band=red&hdu=CCD2");
        Assert.True(MeanGray(bright, 20, 20, 100) > MeanGray(faint, 20, 20, 100) + 40);
    }

    [Theory]
    [InlineData("/tiles/single/3/0/0.png", HttpStatusCode.NotFound)]
    [InlineData("/tiles/single/2/3/0.png", HttpStatusCode.NotFound)]
    [InlineData("/tiles/single/2/0/2.png", HttpStatusCode.NotFound)]
    [InlineData("/tiles/single/0/-1/0.png", HttpStatusCode.NotFound)]
    [InlineData("/tiles/nowhere/0/0/0.png", HttpStatusCode.NotFound)]
    [InlineData("/tiles/trio/0/0/0.png?band=violet", HttpStatusCode.NotFound)]
    public async Task Tiles_outside_the_grid_or_of_unknown_fields_get_problem_details(string url, HttpStatusCode status)
    {
        using var factory = new MosaicFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(client, "single");
        var response = await client.GetAsync(url);
        Assert.Equal(status, response.StatusCode);
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
        Assert.False(response.Headers.CacheControl?.Public ?? false, "errors are never cached");
    }

    [Fact]
    public async Task Versioned_tile_urls_are_immutable_and_revalidate_with_their_etag()
    {
        using var factory = new MosaicFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(client, "single");
        var field = await client.GetFromJsonAsync<JsonElement>("/api/fields/single");
        var version = field.GetProperty("bands")[0].GetProperty("version").GetString();

        var pinned = await client.GetAsync($"/tiles/single/1/0/0.png?v={version}");
        Assert.Equal("public, max-age=31536000, immutable", pinned.Headers.CacheControl?.ToString().Replace(" ", "").Replace(",", ", "));
        var loose = await client.GetAsync("/tiles/single/1/0/0.png");
        Assert.True(loose.Headers.CacheControl?.NoCache);
        Assert.Equal(pinned.Headers.ETag, loose.Headers.ETag);

        var again = new HttpRequestMessage(HttpMethod.Get, "/tiles/single/1/0/0.png");
        again.Headers.IfNoneMatch.Add(pinned.Headers.ETag!);
        var notModified = await client.SendAsync(again);
        Assert.Equal(HttpStatusCode.NotModified, notModified.StatusCode);
    }

    [Fact]
    public async Task Pyramids_are_reused_across_restarts_and_rebuilt_when_the_file_changes()
    {
        var dataDir = Path.Combine(data.Root, $"restart-{Guid.NewGuid():N}");
        Directory.CreateDirectory(dataDir);
        var file = Path.Combine(dataDir, "frame.fits");
        File.Copy(Path.Combine(data.DataDirectory, "single.fits"), file);
        var cache = data.NewCacheDirectory();

        string firstVersion;
        using (var first = new MosaicFactory(dataDir, cache))
        using (var client = first.CreateClient())
        {
            await MosaicFactory.WaitForPyramidsAsync(client, "frame");
            firstVersion = (await client.GetFromJsonAsync<JsonElement>("/api/fields/frame")).GetProperty("bands")[0].GetProperty("version").GetString()!;
        }
        var built = Directory.GetDirectories(Path.Combine(cache, "pyramids"));
        Assert.Single(built);
        var builtAt = Directory.GetLastWriteTimeUtc(built[0]);

        using (var second = new MosaicFactory(dataDir, cache))
        using (var client = second.CreateClient())
        {
            // Found in the cache at start: ready at once, nothing rebuilt.
            var hdu = (await client.GetFromJsonAsync<JsonElement>("/api/fields/frame")).GetProperty("hdus")[0];
            Assert.Equal("ready", hdu.GetProperty("pyramid").GetProperty("state").GetString());
            Assert.Equal(builtAt, Directory.GetLastWriteTimeUtc(built[0]));

            // The file changes under the running server: a new version, and a new pyramid for it.
            File.SetLastWriteTimeUtc(file, DateTime.UtcNow.AddMinutes(5));
            await Task.Delay(1100); // the catalog rescans at most once a second
            var changed = await client.GetFromJsonAsync<JsonElement>("/api/fields/frame");
            Assert.NotEqual(firstVersion, changed.GetProperty("bands")[0].GetProperty("version").GetString());
            await MosaicFactory.WaitForPyramidsAsync(client, "frame");
            Assert.Equal(2, Directory.GetDirectories(Path.Combine(cache, "pyramids")).Length);
        }
    }
}
