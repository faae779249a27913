using System.Globalization;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Reference;
using Mosaic.Browser.Tests.Viewer;

namespace Mosaic.Browser.Tests;

[Collection(BrowserCollection.Name)]
public sealed class SkyReadoutTests(MosaicSite site)
{
    // Three zoom levels past native: an image pixel is 8 x 8 screen pixels, so the pointer lands well inside it.
    private const int ZoomPastNative = 3;

    [Fact]
    public async Task The_readout_shows_the_ra_dec_and_galactic_position_astropy_gives_for_the_point_under_the_pointer()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdus.Last();
        var file = site.BandFile(band);
        var (px, py) = (hdu.Width / 3, hdu.Height * 2 / 3);
        var z = hdu.MaxZoom + ZoomPastNative;

        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, px, py, z).ToQuery());
        await viewer.WaitForTilesAsync();
        var box = await viewer.MapBoxAsync();
        var mapping = new ScreenMapping(box.Width, box.Height, px, py, z, hdu.MaxZoom);

        // Pixel centre, then a point a third of a pixel off it: the sky position follows the point, not the pixel.
        foreach (var (dx, dy) in new[] { (0.0, 0.0), (0.3, -0.3) })
        {
            var (cx, cy) = mapping.ToContainer(px + dx, py + dy);
            await viewer.PointAtAsync(cx, cy);
            var readout = await viewer.ReadoutAsync();
            // Within 0.2 pixel of the pointer: Leaflet's whole-pixel origin and mouse events put it up to ~1 screen
            // pixel (1/8 image pixel here) from where the mapping says.
            var sky = await viewer.SkyReadoutNearAsync(px + dx, py + dy, tolerance: 0.2);
            Assert.Equal((px.ToString(CultureInfo.InvariantCulture), py.ToString(CultureInfo.InvariantCulture)), (readout.X, readout.Y));
            Assert.Equal("sky", sky.Kind);
            // The point probed lies in the pixel shown (FITS pixel i covers [i - 0.5, i + 0.5)).
            Assert.InRange(sky.AtX!.Value, px - 0.5, px + 0.5);
            Assert.InRange(sky.AtY!.Value, py - 0.5, py + 0.5);

            // astropy.wcs all_pix2world (origin 1, SIP included) and SkyCoord(...).galactic, Debian python3-astropy.
            var expected = AstropyWcs.PixelToSky(file, hdu.Index, sky.AtX.Value, sky.AtY.Value);
            AssertSexagesimal(sky.Ra, expected.Ra / 15, minimumDecimals: 3, "RA (hours)");
            AssertSexagesimal(sky.Dec, expected.Dec, minimumDecimals: 2, "Dec");
            AssertDegrees(sky.RaDegrees, expected.Ra, "RA");
            AssertDegrees(sky.DecDegrees, expected.Dec, "Dec");
            AssertDegrees(sky.L, expected.L, "l");
            AssertDegrees(sky.B, expected.B, "b");
        }
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/sky-client-readout.png" });
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task A_chip_without_celestial_wcs_reads_no_wcs_with_the_reason_and_offers_no_sky_tools()
    {
        // The server's own account of the frame: pixels, and why there is no sky.
        var hdu = await WaitForReadyAsync(MosaicSite.UnsolvedFieldId);
        Assert.Equal(System.Text.Json.JsonValueKind.Null, hdu.GetProperty("sky").ValueKind);
        var reason = hdu.GetProperty("skyError").GetString();
        Assert.False(string.IsNullOrWhiteSpace(reason));
        var (width, height) = (hdu.GetProperty("width").GetInt32(), hdu.GetProperty("height").GetInt32());

        await using var viewer = await site.OpenViewerAsync($"?field={MosaicSite.UnsolvedFieldId}&grid=1");
        await viewer.WaitForTilesAsync();
        var box = await viewer.MapBoxAsync();
        await viewer.PointAtAsync(box.Width / 2, box.Height / 2);
        var readout = await viewer.ReadoutAsync();
        // Pixels are served as ever: astropy.io.fits reads the same value.
        Assert.Equal("value", readout.Kind);
        var (px, py) = (int.Parse(readout.X, CultureInfo.InvariantCulture), int.Parse(readout.Y, CultureInfo.InvariantCulture));
        Assert.InRange(px, 1, width);
        Assert.InRange(py, 1, height);
        var file = Path.Combine(site.DataDirectory, MosaicSite.UnsolvedFieldId + ".fits");
        Assert.Equal((float)AstropyFits.Pixel(file, 1, px, py).Value!.Value, (float)readout.RawValue!.Value);

        var sky = await viewer.SkyReadoutAsync();
        Assert.Equal("no-wcs", sky.Kind);
        Assert.True(await viewer.Page.Locator("#pixel-readout [data-role=no-wcs]").IsVisibleAsync());
        Assert.Equal("no WCS", (await viewer.Page.TextContentAsync("#pixel-readout [data-role=no-wcs]"))!.Trim());
        Assert.Equal(reason, sky.NoWcsReason);
        Assert.False(await viewer.Page.Locator("#pixel-readout [data-role=ra]").IsVisibleAsync());
        // No grid (though the link asks for one), compass or scale bar without a WCS to draw them from.
        Assert.True(await viewer.Page.Locator("#grid-toggle").IsDisabledAsync());
        Assert.Equal(0, await viewer.GridLineCountAsync());
        Assert.True(await viewer.Page.Locator("#compass").IsHiddenAsync());
        Assert.True(await viewer.Page.Locator("#scale-bar").IsHiddenAsync());
        Assert.Empty(viewer.PageErrors);
    }

    private async Task<System.Text.Json.JsonElement> WaitForReadyAsync(string fieldId)
    {
        var deadline = DateTime.UtcNow + TimeSpan.FromSeconds(60);
        while (true)
        {
            var hdu = (await site.GetJsonAsync($"api/fields/{fieldId}")).GetProperty("bands")[0].GetProperty("hdus")[0];
            var state = hdu.GetProperty("pyramid").GetProperty("state").GetString();
            if (state == "ready") return hdu;
            if (state == "failed" || DateTime.UtcNow > deadline) throw new InvalidOperationException($"the pyramid of {fieldId} is {state}");
            await Task.Delay(200);
        }
    }

    /// <summary>Equal to the displayed precision: within one unit of the text's last second digit.</summary>
    private static void AssertSexagesimal(string text, double expected, int minimumDecimals, string what)
    {
        var (shown, decimals) = Sexagesimal.Parse(text);
        Assert.True(decimals >= minimumDecimals, $"{what} '{text}' shows {decimals} decimals of seconds, fewer than {minimumDecimals}");
        var unit = Math.Pow(10, -decimals) / 3600;
        Assert.True(Math.Abs(shown - expected) <= unit, $"{what}: shown '{text}', astropy {expected:R}");
    }

    /// <summary>Decimal degrees ("188.736621°", "-1.034292°", "+12.5°"): within one unit of the last digit shown.</summary>
    private static void AssertDegrees(string text, double expected, string what)
    {
        Assert.EndsWith("°", text);
        var number = text[..^1].Replace('\u2212', '-');
        var point = number.IndexOf('.', StringComparison.Ordinal);
        var decimals = point < 0 ? 0 : number.Length - point - 1;
        // Six decimals (3.6 mas) at least, as fine as the sexagesimal texts beside them.
        Assert.True(decimals >= 6, $"{what} '{text}' shows only {decimals} decimals");
        var shown = double.Parse(number, NumberStyles.Float, CultureInfo.InvariantCulture);
        Assert.True(Math.Abs(shown - expected) <= Math.Pow(10, -decimals), $"{what}: shown '{text}', astropy {expected:R}");
    }
}
