using Mosaic.Browser.Tests.Hosting;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Browser.Tests;

[Collection(BrowserCollection.Name)]
public sealed class TileLoadingTests(MosaicSite site)
{
    // PNG specification (ISO/IEC 15948, W3C PNG 2nd ed.) §5.2: the eight-byte signature.
    private static readonly byte[] PngSignature = [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A];

    [Fact]
    public async Task The_page_opens_on_the_default_view_with_real_png_tiles_and_no_failed_tile_request()
    {
        await using var viewer = await site.OpenViewerAsync();
        var tiles = await viewer.WaitForTilesAsync();
        await viewer.SaveScreenshotAsync("opened");

        Assert.NotEmpty(tiles);
        Assert.All(tiles, tile =>
        {
            Assert.True(tile.Loaded, $"tile not loaded: {tile.Src}");
            Assert.Equal(256, tile.NaturalWidth);
            Assert.Equal(256, tile.NaturalHeight);
            Assert.Contains($"band={site.Demo.DefaultBand}", tile.Src);
            // The demo's bands have several chips each: the page opens on the band's whole field.
            Assert.Contains("hdu=canvas", tile.Src);
        });
        Assert.Empty(viewer.FailedTileRequests);
        Assert.Empty(viewer.PageErrors);

        // The page says what it shows: the default field and band the API names, and its whole field.
        var url = viewer.Url;
        Assert.Equal(MosaicSite.DemoFieldId, url.Field);
        Assert.Equal(site.Demo.DefaultBand, url.Band);
        Assert.True(url.WholeField, $"not on the whole field: {viewer.Page.Url}");

        // The bytes behind a DOM tile are a PNG by its signature, and ImageSharp (a general-purpose decoder) reads
        // it as 256 x 256 RGBA.
        using var http = site.CreateHttpClient();
        using var response = await http.GetAsync(new Uri(tiles[0].Src));
        Assert.Equal("image/png", response.Content.Headers.ContentType?.MediaType);
        var bytes = await response.Content.ReadAsByteArrayAsync();
        Assert.Equal(PngSignature, bytes.Take(8));
        using var image = Image.Load<Rgba32>(bytes);
        Assert.Equal((256, 256), (image.Width, image.Height));
    }
}
