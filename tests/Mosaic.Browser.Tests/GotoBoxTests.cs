using System.Globalization;
using System.Net;
using System.Text.Json;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Reference;
using Mosaic.Browser.Tests.Viewer;

namespace Mosaic.Browser.Tests;

[Collection(BrowserCollection.Name)]
public sealed class GotoBoxTests(MosaicSite site)
{
    [Fact]
    public async Task A_typed_position_on_another_chip_opens_that_chip_centred_on_it_with_a_mark_there()
    {
        var band = site.Demo.DefaultBand;
        var start = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        var target = site.Demo.Band(band).Hdus.Last(h => h.Index != start.Index);
        var file = site.BandFile(band);
        // Off pixel centres, so landing on a pixel centre would not pass for landing on the position.
        var (tx, ty) = (target.Width * 0.3 + 0.25, target.Height * 0.6 - 0.35);
        // astropy.wcs all_pix2world (Debian python3-astropy): the position of that point of the target chip.
        var sky = AstropyWcs.PixelToSky(file, target.Index, tx, ty);

        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, start.Index, start.Width / 2.0, start.Height / 2.0, start.MaxZoom + 1).ToQuery());
        await viewer.WaitForTilesAsync();
        Assert.Null(await viewer.MarkerCentreAsync());

        // Decimal degrees to 1e-8° (36 µas): far finer than a pixel (0.25″ in the demo).
        var before = viewer.Url;
        await viewer.GoToAsync(string.Create(CultureInfo.InvariantCulture, $"{sky.Ra:F8} {sky.Dec:F8}"));
        var moved = await viewer.WaitForUrlChangeAsync(before);
        await viewer.WaitForTilesAsync($"hdu={target.Index}");
        moved = viewer.Url;
        Assert.Equal(target.Index, moved.Hdu);
        Assert.Equal(target.Index.ToString(CultureInfo.InvariantCulture), await viewer.Page.InputValueAsync("#hdu-picker"));
        // The URL keeps the centre to 0.01 pixel.
        Assert.Equal(tx, moved.X!.Value, 0.02);
        Assert.Equal(ty, moved.Y!.Value, 0.02);
        // Zoomed in only if the view, kept over the chip, could not otherwise be centred there.
        Assert.True(moved.Z >= before.Z, $"zoom {before.Z} -> {moved.Z}");
        await AssertMarkAtMiddleAsync(viewer);

        // Sexagesimal, on the chip now shown, with the button instead of Enter: the view moves, the chip stays.
        var (sx, sy) = (target.Width * 0.7 - 0.2, target.Height * 0.25 + 0.4);
        var second = AstropyWcs.PixelToSky(file, target.Index, sx, sy);
        await viewer.Page.FillAsync("#goto-input", $"{Sexagesimal.FormatRa(second.Ra, 4)} {Sexagesimal.FormatDec(second.Dec, 3)}");
        await viewer.Page.ClickAsync("#goto-box [data-role=go]");
        var again = await viewer.WaitForUrlChangeAsync(moved);
        Assert.Equal(target.Index, again.Hdu);
        // 0.0001 s of RA and 0.001″ of Dec are a few thousandths of a pixel; the URL rounds to 0.01.
        Assert.Equal(sx, again.X!.Value, 0.03);
        Assert.Equal(sy, again.Y!.Value, 0.03);
        await viewer.WaitForTilesAsync();
        await AssertMarkAtMiddleAsync(viewer);
        Assert.Equal(1, await viewer.Page.Locator("#image-view .goto-marker").CountAsync());
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/sky-client-goto.png" });

        // The mark can be taken away.
        await viewer.Page.ClickAsync("#goto-box [data-role=clear]");
        Assert.Null(await viewer.MarkerCentreAsync());
        Assert.True(await viewer.Page.Locator("#goto-box [data-role=clear]").IsHiddenAsync());
        Assert.Empty(viewer.PageErrors);
    }

    [Theory]
    // Dec beyond the pole: malformed for the server's parser (400).
    [InlineData("02:31:15.0 +95:00:00", HttpStatusCode.BadRequest)]
    [InlineData("somewhere near the middle", HttpStatusCode.BadRequest)]
    // A valid position far from the demo field's pointing (RA 37.8°, Dec −21.45°): on no chip (404).
    [InlineData("14:00:00 +45:00:00", HttpStatusCode.NotFound)]
    public async Task A_position_the_server_refuses_shows_its_reason_and_leaves_the_view_alone(string typed, HttpStatusCode status)
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        // What the server says about it (RFC 9457 problem details), asked directly.
        using var http = site.CreateHttpClient();
        using var response = await http.GetAsync($"api/fields/{site.Demo.Id}/probe?band={Uri.EscapeDataString(band)}&position={Uri.EscapeDataString(typed)}");
        Assert.Equal(status, response.StatusCode);
        var detail = JsonDocument.Parse(await response.Content.ReadAsStringAsync()).RootElement.GetProperty("detail").GetString();
        Assert.False(string.IsNullOrWhiteSpace(detail));

        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, 100.5, 200.5, hdu.MaxZoom).ToQuery());
        await viewer.WaitForTilesAsync();
        var before = viewer.Url;
        await viewer.GoToAsync(typed);
        var message = await viewer.MessageAsync();
        Assert.Contains(detail!, message, StringComparison.Ordinal);
        Assert.Equal("true", await viewer.Page.GetAttributeAsync("#goto-input", "aria-invalid"));
        Assert.Equal(before, viewer.Url);
        Assert.Null(await viewer.MarkerCentreAsync());
        if (status == HttpStatusCode.NotFound) await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/sky-client-goto-error.png" });
    }

    private static async Task AssertMarkAtMiddleAsync(ViewerPage viewer)
    {
        var box = await viewer.MapBoxAsync();
        var mark = await viewer.MarkerCentreAsync();
        Assert.NotNull(mark);
        Assert.True(await viewer.Page.Locator("#image-view .goto-marker").IsVisibleAsync(), "the mark is drawn");
        // Leaflet places markers on whole screen pixels.
        Assert.True(Math.Abs(mark.X - box.Width / 2) <= 1.5 && Math.Abs(mark.Y - box.Height / 2) <= 1.5,
            $"mark at ({mark.X}, {mark.Y}), view middle ({box.Width / 2}, {box.Height / 2})");
    }
}
