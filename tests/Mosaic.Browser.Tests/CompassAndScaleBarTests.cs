using System.Globalization;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Reference;
using Mosaic.Browser.Tests.Viewer;

namespace Mosaic.Browser.Tests;

[Collection(BrowserCollection.Name)]
public sealed class CompassAndScaleBarTests(MosaicSite site)
{
    [Fact]
    public async Task The_compass_arrows_point_on_screen_where_north_and_east_lie_by_astropy()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdus.Last();
        var file = site.BandFile(band);
        var (cx, cy) = (hdu.Width / 2.0 + 0.5, hdu.Height / 2.0 + 0.5);
        // Zoomed in far enough that the view lies inside the chip: the compass is for the middle of the view.
        var z = hdu.MaxZoom + 2.0;
        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, cx, cy, z).ToQuery());
        await viewer.WaitForTilesAsync();
        await viewer.Page.WaitForSelectorAsync("#compass:not([hidden])", new() { Timeout = 15_000 });

        // astropy.wcs all_world2pix (Debian python3-astropy) of points 1″ north and east of the middle of the view.
        var local = AstropyWcs.Local(file, hdu.Index, cx, cy);
        // Pixel axes have y up, the screen y down.
        var north = ScreenAngle(local.North.Dx, -local.North.Dy);
        var east = ScreenAngle(local.East.Dx, -local.East.Dy);

        // The arrows as drawn (their SVG end points) ...
        Assert.True(AngleBetween(north, await ArrowAngleAsync(viewer, "north")) <= 0.5, $"north arrow vs astropy {north:F2}°");
        Assert.True(AngleBetween(east, await ArrowAngleAsync(viewer, "east")) <= 0.5, $"east arrow vs astropy {east:F2}°");
        // ... and where their letters land on screen, from the arrows' common foot.
        var foot = await viewer.CentreAsync(viewer.Page.Locator("#compass .compass-foot"));
        var n = await viewer.CentreAsync(viewer.Page.Locator("#compass [data-role=north-label]"));
        var e = await viewer.CentreAsync(viewer.Page.Locator("#compass [data-role=east-label]"));
        Assert.True(AngleBetween(north, ScreenAngle(n.X - foot.X, n.Y - foot.Y)) <= 4, $"N sits at {ScreenAngle(n.X - foot.X, n.Y - foot.Y):F1}°, north is {north:F1}°");
        Assert.True(AngleBetween(east, ScreenAngle(e.X - foot.X, e.Y - foot.Y)) <= 4, $"E sits at {ScreenAngle(e.X - foot.X, e.Y - foot.Y):F1}°, east is {east:F1}°");
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task The_scale_bar_is_as_long_as_its_label_says_and_changes_when_zooming_in()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        var file = site.BandFile(band);
        var (cx, cy) = (hdu.Width / 2.0, hdu.Height / 2.0);
        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, cx, cy, hdu.MaxZoom).ToQuery());
        await viewer.WaitForTilesAsync();
        // astropy: arcsec per image pixel at the middle, sqrt |det J| of all_pix2world's local sky offsets.
        var pixelScale = AstropyWcs.Local(file, hdu.Index, cx, cy).PixelScale;

        var first = await ScaleBarAsync(viewer, pixelScale, hdu.MaxZoom, hdu.MaxZoom);

        // Two zoom levels in (four presses of half a level): four times the screen pixels per arcsec, more than the
        // 60-150 pixel range can absorb, so the bar must change its length.
        var url = viewer.Url;
        for (var press = 0; press < 4; press++)
        {
            await viewer.Page.ClickAsync(".leaflet-control-zoom-in");
            url = await viewer.WaitForUrlChangeAsync(url);
        }
        Assert.Equal(hdu.MaxZoom + 2, url.Z!.Value, 2);
        var second = await ScaleBarAsync(viewer, pixelScale, url.Z.Value, hdu.MaxZoom);
        Assert.NotEqual(first.Label, second.Label);
        Assert.True(second.Arcsec < first.Arcsec, $"zoomed in, the bar stands for {second.Label}, before for {first.Label}");
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/sky-client-scale.png" });
        Assert.Empty(viewer.PageErrors);
    }

    /// <summary>The bar's label and its on-screen length, checked against each other and against astropy's scale.</summary>
    private static async Task<(string Label, double Arcsec)> ScaleBarAsync(ViewerPage viewer, double pixelScale, double z, int maxZoom)
    {
        var arcsecPerScreenPixel = pixelScale / Math.Pow(2, z - maxZoom);
        var deadline = DateTime.UtcNow + TimeSpan.FromSeconds(10);
        while (true)
        {
            var bar = viewer.Page.Locator("#scale-bar [data-role=bar]");
            if (await viewer.Page.Locator("#scale-bar").IsVisibleAsync())
            {
                var label = (await viewer.Page.TextContentAsync("#scale-bar [data-role=label]"))!.Trim();
                var width = (await bar.BoundingBoxAsync())!.Width;
                var arcsec = ParseAngle(label);
                // Bar length on screen times arcsec per screen pixel is the labelled length (1 %: rounding of the
                // CSS width and the scale's change across the view).
                if (Math.Abs(width * arcsecPerScreenPixel - arcsec) <= 0.01 * arcsec)
                {
                    Assert.InRange(width, 59, 151);
                    return (label, arcsec);
                }
                if (DateTime.UtcNow > deadline)
                    Assert.Fail($"scale bar '{label}' is {width:F1} px: {width * arcsecPerScreenPixel:F3}″ by astropy's {pixelScale:F5}″/px");
            }
            else if (DateTime.UtcNow > deadline)
            {
                Assert.Fail("the scale bar is not shown");
            }
            await Task.Delay(50);
        }
    }

    /// <summary>"0.5″", "20″", "2′", "1°" in arcseconds.</summary>
    private static double ParseAngle(string label)
    {
        var unit = label[^1] switch
        {
            '″' => 1.0,
            '′' => 60.0,
            '°' => 3600.0,
            _ => throw new FormatException($"scale bar label '{label}' has no angle unit"),
        };
        return double.Parse(label[..^1], CultureInfo.InvariantCulture) * unit;
    }

    private static async Task<double> ArrowAngleAsync(ViewerPage viewer, string role)
    {
        var ends = await viewer.Page.EvalOnSelectorAsync<double[]>($"#compass [data-role={role}]",
            "l => ['x1', 'y1', 'x2', 'y2'].map(a => Number(l.getAttribute(a)))");
        return ScreenAngle(ends[2] - ends[0], ends[3] - ends[1]);
    }

    /// <summary>Direction of a screen vector (x right, y down) in degrees.</summary>
    private static double ScreenAngle(double dx, double dy) => Math.Atan2(dy, dx) * 180 / Math.PI;

    private static double AngleBetween(double a, double b) => Math.Abs(((a - b) % 360 + 540) % 360 - 180);
}
