using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Reference;
using Mosaic.Browser.Tests.Viewer;

namespace Mosaic.Browser.Tests;

[Collection(BrowserCollection.Name)]
public sealed class SkyGridTests(MosaicSite site)
{
    // Grid lines are traced to half a screen pixel by the server; Leaflet puts paths and markers on whole pixels,
    // and a label's box centre rounds too: two screen pixels covers all three.
    private const double ToleranceScreenPixels = 2;

    [Fact]
    public async Task The_grid_toggle_draws_lines_and_labels_where_astropy_puts_those_coordinates_and_survives_a_reload()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        var file = site.BandFile(band);
        var (cx, cy, z) = (hdu.Width / 2.0 + 0.5, hdu.Height / 2.0 + 0.5, (double)hdu.MaxZoom);

        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, cx, cy, z).ToQuery());
        await viewer.WaitForTilesAsync();
        Assert.Equal("false", await viewer.Page.GetAttributeAsync("#grid-toggle", "aria-pressed"));
        Assert.Equal(0, await viewer.GridLineCountAsync());
        Assert.False(QueryString.Parse(viewer.Page.Url).ContainsKey("grid"));

        await viewer.Page.ClickAsync("#grid-toggle");
        await viewer.WaitForGridAsync();
        Assert.Equal("true", await viewer.Page.GetAttributeAsync("#grid-toggle", "aria-pressed"));
        Assert.Equal("1", QueryString.Parse(viewer.Page.Url)["grid"]);
        await AssertGridMatchesAstropyAsync(viewer, file, hdu, cx, cy, z);
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/sky-client-grid.png" });

        // The link opens with the grid on, in a fresh browser context.
        await using (var reloaded = await site.OpenViewerAsync(new Uri(viewer.Page.Url).Query))
        {
            await reloaded.WaitForTilesAsync();
            await reloaded.WaitForGridAsync();
            Assert.Equal("true", await reloaded.Page.GetAttributeAsync("#grid-toggle", "aria-pressed"));
            await AssertGridMatchesAstropyAsync(reloaded, file, hdu, cx, cy, z);
        }

        // Off again: no lines, and the URL says nothing of a grid.
        await viewer.Page.ClickAsync("#grid-toggle");
        Assert.Equal(0, await viewer.GridLineCountAsync());
        Assert.Equal(0, await viewer.Page.Locator("#image-view .sky-grid-label").CountAsync());
        Assert.False(QueryString.Parse(viewer.Page.Url).ContainsKey("grid"));
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task After_a_pan_the_grid_covers_the_new_view_and_still_lies_on_its_coordinates()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        var file = site.BandFile(band);
        var z = hdu.MaxZoom + 1.0;
        await using var viewer = await site.OpenViewerAsync(
            new ViewQuery(site.Demo.Id, band, hdu.Index, hdu.Width / 2.0, hdu.Height * 0.75, z).ToQuery() + "&grid=1");
        await viewer.WaitForTilesAsync();
        await viewer.WaitForGridAsync();
        var box = await viewer.MapBoxAsync();
        var scale = Math.Pow(2, z - hdu.MaxZoom);
        var before = viewer.Url;
        var bottomBefore = before.Y!.Value - box.Height / 2 / scale;

        // Pan down with the keyboard: the image below the old view comes on screen, and the grid must follow it.
        await viewer.Page.FocusAsync("#image-view");
        await viewer.Page.Keyboard.PressAsync("ArrowDown");
        var after = await viewer.WaitForUrlChangeAsync(before);
        Assert.True(after.Y < before.Y, $"y {before.Y} -> {after.Y} after the down arrow");
        var bottomAfter = after.Y!.Value - box.Height / 2 / scale;
        var mapping = new ScreenMapping(box.Width, box.Height, after.X!.Value, after.Y.Value, z, hdu.MaxZoom);
        // Lines of RA run up and down the whole view: once the new grid is in, one reaches below the old bottom edge.
        var lowest = double.PositiveInfinity;
        var deadline = DateTime.UtcNow + TimeSpan.FromSeconds(15);
        while (DateTime.UtcNow < deadline)
        {
            var points = (await viewer.GridLinesAsync(samples: 16)).Where(l => l.Axis == "ra").SelectMany(l => l.Points);
            lowest = points.Select(p => mapping.ToFits(p.X, p.Y).Y).DefaultIfEmpty(double.PositiveInfinity).Min();
            if (lowest < bottomBefore - 10) break;
            await Task.Delay(100);
        }
        Assert.True(lowest < bottomBefore - 10, $"the grid reaches down to y = {lowest:F1}, the old view's bottom was {bottomBefore:F1}, the new one is {bottomAfter:F1}");
        await AssertGridMatchesAstropyAsync(viewer, file, hdu, after.X.Value, after.Y.Value, z);
        Assert.Empty(viewer.PageErrors);
    }

    /// <summary>
    /// Every sampled point of every line, and every label, lies where astropy.wcs all_pix2world (Debian
    /// python3-astropy, SIP included) gives the line's RA or Dec, to within two screen pixels on the sky.
    /// </summary>
    private static async Task AssertGridMatchesAstropyAsync(ViewerPage viewer, string file, HduInfo hdu, double cx, double cy, double z)
    {
        var box = await viewer.MapBoxAsync();
        var mapping = new ScreenMapping(box.Width, box.Height, cx, cy, z, hdu.MaxZoom);
        var lines = await viewer.GridLinesAsync(samples: 8);
        var labels = await viewer.GridLabelsAsync();
        Assert.Contains(lines, l => l.Axis == "ra");
        Assert.Contains(lines, l => l.Axis == "dec");
        Assert.NotEmpty(labels);

        var checks = lines.SelectMany(l => l.Points.Select(p => (l.Axis, l.Value, Point: p, What: $"{l.Axis} line {l.Value}")))
            .Concat(labels.Select(l => (l.Axis, l.Value, Point: l.Centre, What: $"label '{l.Text}'")))
            .ToList();
        var pixels = checks.Select(c => mapping.ToFits(c.Point.X, c.Point.Y)).ToList();
        var sky = AstropyWcs.PixelToSky(file, hdu.Index, pixels);
        // Arcsec per screen pixel, from astropy's pixel scale at the middle of the view.
        var arcsecPerScreenPixel = AstropyWcs.Local(file, hdu.Index, cx, cy).PixelScale / mapping.Scale;
        var tolerance = ToleranceScreenPixels * arcsecPerScreenPixel;
        for (var i = 0; i < checks.Count; i++)
        {
            var (axis, value, point, what) = checks[i];
            var off = axis == "ra"
                ? WrapDegrees(sky[i].Ra - value) * Math.Cos(sky[i].Dec * Math.PI / 180) * 3600
                : (sky[i].Dec - value) * 3600;
            Assert.True(Math.Abs(off) <= tolerance,
                $"{what} at screen ({point.X:F1}, {point.Y:F1}) is at RA {sky[i].Ra:F6}, Dec {sky[i].Dec:F6}: {off:F3}″ off (tolerance {tolerance:F3}″)");
        }
    }

    private static double WrapDegrees(double degrees) => ((degrees % 360) + 540) % 360 - 180;
}
