using System.Globalization;
using System.Text.Json;
using Microsoft.Playwright;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Reference;
using Mosaic.Browser.Tests.Viewer;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Browser.Tests;

/// <summary>
/// Links in format version 1: the centre named by RA/Dec where the HDU has a celestial WCS, opened in another
/// browser context; links without a version (version 0) still opening their pixel centre.
/// </summary>
[Collection(BrowserCollection.Name)]
public sealed class LinkTests(MosaicSite site)
{
    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    [Fact]
    public async Task A_link_opened_in_a_second_browser_context_shows_the_same_view()
    {
        var band = site.Demo.DefaultBand;
        var canvas = site.Demo.Band(band).WholeField;
        // One zoom level past native (2 screen pixels per canvas pixel), centred off any pixel centre.
        var z = canvas.MaxZoom + 1;
        var x = Math.Round(canvas.Width * 0.43 + 0.37, 2);
        var y = Math.Round(canvas.Height * 0.56 + 0.21, 2);
        await using var first = await site.OpenViewerAsync(
            $"?field={MosaicSite.DemoFieldId}&band={band}&hdu=canvas&x={Text(x)}&y={Text(y)}&z={z}");
        await first.WaitForTilesAsync();

        // Display settings through the panel, as a person would set them.
        await first.Page.SelectOptionAsync("#stretch-picker", "linear");
        await first.WaitForTilesAsync("stretch=linear");
        await first.Page.CheckAsync("input[name=palette][value='cubehelix']");
        var firstTiles = await first.WaitForTilesAsync("palette=cubehelix");
        await first.WaitForSkyUrlAsync();
        var view = first.Url;
        Assert.Equal((x, y, (double)z), (view.X, view.Y, view.Z));

        // The share panel's link: version 1, the centre on the sky (7 decimals, the contract's form), no pixels.
        var share = new ShareControls(first);
        var link = await share.LinkAsync();
        var query = QueryString.Parse(link);
        Assert.Equal("1", query["v"]);
        Assert.Matches(@"^\d{1,3}\.\d{7}$", query["ra"]);
        Assert.Matches(@"^[-]?\d{1,2}\.\d{7}$", query["dec"]);
        Assert.False(query.ContainsKey("x") || query.ContainsKey("y"), $"pixel centre in {link}");
        Assert.Equal(("canvas", "linear", "cubehelix", Text(z)), (query["hdu"], query["stretch"], query["palette"], query["z"]));
        // The page URL names the view the same way.
        Assert.Equal(link, first.Page.Url);

        // Copy puts the same text on the clipboard.
        await first.Context.GrantPermissionsAsync(["clipboard-read", "clipboard-write"]);
        await first.Page.ClickAsync("#share-panel [data-role=copy]");
        await first.Page.WaitForFunctionAsync("() => document.querySelector('#share-panel [data-role=link-status]').textContent === 'Copied.'");
        Assert.Equal(link, await first.Page.EvaluateAsync<string>("() => navigator.clipboard.readText()"));
        await share.CloseAsync();

        // Another browser context, no shared storage or cache: the same centre, zoom, display and tiles.
        await using var second = await site.OpenViewerAsync(new Uri(link).Query);
        var secondTiles = await second.WaitForTilesAsync("palette=cubehelix");
        await second.WaitForSkyUrlAsync();
        var opened = second.Url;
        var scale = Math.Pow(2, z - canvas.MaxZoom);
        Assert.InRange(Math.Abs(opened.X!.Value - view.X!.Value) * scale, 0, 0.01);
        Assert.InRange(Math.Abs(opened.Y!.Value - view.Y!.Value) * scale, 0, 0.01);
        Assert.Equal(view.Z, opened.Z);
        Assert.True(opened.WholeField, $"not on the whole field: {second.Page.Url}");
        Assert.Equal("linear", await second.Page.InputValueAsync("#stretch-picker"));
        Assert.True(await second.Page.IsCheckedAsync("input[name=palette][value='cubehelix']"));
        Assert.Equal(link, second.Page.Url);
        Assert.Equal(SortedPaths(firstTiles), SortedPaths(secondTiles));

        // Identical screen pixels over the middle of the image (clear of the readout, compass and scale bar).
        var firstPixels = await MiddleScreenshotAsync(first);
        var secondPixels = await MiddleScreenshotAsync(second);
        Assert.Equal(firstPixels.Length, secondPixels.Length);
        var differing = firstPixels.Zip(secondPixels).Count(pair => pair.First != pair.Second);
        Assert.Equal(0, differing);
        // Not a blank region: the comparison would then say nothing.
        Assert.True(firstPixels.Distinct().Count() > 16, "the compared region is (nearly) one colour");

        await first.SaveScreenshotAsync("link-share-panel-source");
        Assert.True(first.PageErrors.Count == 0, string.Join("\n", first.PageErrors));
        Assert.True(second.PageErrors.Count == 0, string.Join("\n", second.PageErrors));
        Assert.Empty(second.FailedTileRequests);
    }

    [Fact]
    public async Task A_version_1_link_by_ra_dec_lands_on_the_pixel_astropy_finds_on_a_chip_and_on_the_whole_field()
    {
        var band = site.Demo.Bands.First(b => b.Name != site.Demo.DefaultBand).Name;
        var chip = site.Demo.Band(band).Hdus[1];
        var file = site.BandFile(band);
        // A sky position of the chip, written to the link's 7 decimals; astropy.wcs all_world2pix (Debian
        // python3-astropy) of that very text is where the view must be centred.
        var start = AstropyWcs.PixelToSky(file, chip.Index, chip.Width * 0.31 + 0.2, chip.Height * 0.58 + 0.7);
        var ra = start.Ra.ToString("F7", Invariant);
        var dec = start.Dec.ToString("F7", Invariant);
        var expected = AstropyWcs.SkyToPixel(file, chip.Index, double.Parse(ra, Invariant), double.Parse(dec, Invariant));
        Assert.True(expected.OnChip);

        // Two levels past native (4 screen pixels per image pixel): a view of a small chip that fits the area it
        // may be panned over, so nothing moves the centre after landing.
        var z = chip.MaxZoom + 2;
        await using (var viewer = await site.OpenViewerAsync($"?v=1&field={MosaicSite.DemoFieldId}&band={band}&hdu={chip.Index}&ra={ra}&dec={dec}&z={z}"))
        {
            await viewer.WaitForTilesAsync($"hdu={chip.Index}");
            await viewer.WaitForSkyUrlAsync();
            var landed = viewer.Url;
            Assert.Equal((band, chip.Index), (landed.Band, landed.Hdu));
            // The state keeps a hundredth of a pixel (state.js): astropy's position rounded to that, and a little
            // for the two WCS codes' own differences.
            Assert.InRange(Math.Abs(landed.X!.Value - expected.X), 0, 0.0051);
            Assert.InRange(Math.Abs(landed.Y!.Value - expected.Y), 0, 0.0051);
            Assert.Equal((double)z, landed.Z);
            // The readout at the middle of the view names the pixel astropy puts there.
            var box = await viewer.MapBoxAsync();
            var mapping = new ScreenMapping(box.Width, box.Height, landed.X.Value, landed.Y.Value, landed.Z!.Value, chip.MaxZoom);
            var (px, py) = (ScreenMapping.ContainingPixel(expected.X), ScreenMapping.ContainingPixel(expected.Y));
            var (cx, cy) = mapping.ToContainer(px, py);
            await viewer.PointAtAsync(cx, cy);
            var readout = await viewer.ReadoutAsync();
            Assert.Equal((px.ToString(Invariant), py.ToString(Invariant)), (readout.X, readout.Y));
            Assert.True(viewer.PageErrors.Count == 0, string.Join("\n", viewer.PageErrors));
        }

        // On the whole field: the canvas pixel the link lands on is, through the server's exact chain back to the
        // chip, astropy's chip pixel (a hundredth of a canvas pixel is about a hundredth of a chip pixel: the
        // canvas is at the chips' median scale).
        var canvas = site.Demo.Band(band).WholeField;
        await using (var viewer = await site.OpenViewerAsync($"?v=1&field={MosaicSite.DemoFieldId}&band={band}&hdu=canvas&ra={ra}&dec={dec}&z={canvas.MaxZoom}"))
        {
            await viewer.WaitForTilesAsync("hdu=canvas");
            await viewer.WaitForSkyUrlAsync();
            var landed = viewer.Url;
            Assert.True(landed.WholeField);
            var probe = await site.GetJsonAsync(
                $"api/fields/{MosaicSite.DemoFieldId}/probe?band={band}&hdu=canvas&x={Text(landed.X!.Value)}&y={Text(landed.Y!.Value)}");
            Assert.Equal(chip.Index, probe.GetProperty("hdu").GetInt32());
            Assert.InRange(Math.Abs(probe.GetProperty("atX").GetDouble() - expected.X), 0, 0.01);
            Assert.InRange(Math.Abs(probe.GetProperty("atY").GetDouble() - expected.Y), 0, 0.01);
            Assert.True(viewer.PageErrors.Count == 0, string.Join("\n", viewer.PageErrors));
        }
    }

    [Fact]
    public async Task A_link_without_a_version_still_opens_its_pixel_centre_and_a_field_without_wcs_keeps_pixels()
    {
        var band = site.Demo.DefaultBand;
        var chip = site.Demo.Band(band).Hdus[2];
        var (x, y) = (Math.Round(chip.Width * 0.62 + 0.13, 2), Math.Round(chip.Height * 0.27 + 0.41, 2));
        // Version 0: as links were written before format versions, x/y and no v.
        var z = chip.MaxZoom + 2;
        var old = new ViewQuery(MosaicSite.DemoFieldId, band, chip.Index, x, y, z).ToQuery();
        Assert.DoesNotContain("v=", old);
        await using (var viewer = await site.OpenViewerAsync(old))
        {
            await viewer.WaitForTilesAsync($"hdu={chip.Index}");
            Assert.Equal((band, (int?)chip.Index, (double?)x, (double?)y, (double?)z),
                (viewer.Url.Band, viewer.Url.Hdu, viewer.Url.X, viewer.Url.Y, viewer.Url.Z));
            var box = await viewer.MapBoxAsync();
            var mapping = new ScreenMapping(box.Width, box.Height, x, y, z, chip.MaxZoom);
            var (px, py) = (ScreenMapping.ContainingPixel(x), ScreenMapping.ContainingPixel(y));
            var (cx, cy) = mapping.ToContainer(px, py);
            await viewer.PointAtAsync(cx, cy);
            var readout = await viewer.ReadoutAsync();
            Assert.Equal((px.ToString(Invariant), py.ToString(Invariant)), (readout.X, readout.Y));
            // Rewritten in the current format, the centre now on the sky.
            var now = QueryString.Parse(await viewer.WaitForSkyUrlAsync());
            Assert.Equal("1", now["v"]);
            Assert.False(now.ContainsKey("x"));
            Assert.True(await viewer.Page.IsHiddenAsync("#message"), await viewer.Page.TextContentAsync("#message"));
        }

        // No celestial WCS: a version 1 link names the centre by pixel.
        var unsolved = HduInfo.Parse((await site.GetJsonAsync($"api/fields/{MosaicSite.UnsolvedFieldId}")).GetProperty("bands")[0].GetProperty("hdus")[0]);
        await using (var viewer = await site.OpenViewerAsync($"?field={MosaicSite.UnsolvedFieldId}&x=20.25&y=30.5&z={unsolved.MaxZoom}"))
        {
            await viewer.WaitForTilesAsync();
            // Any change rewrites the URL: the grid toggle is off without a WCS, so a display change it is.
            await viewer.Page.SelectOptionAsync("#stretch-picker", "sqrt");
            await viewer.WaitForTilesAsync("stretch=sqrt");
            var share = new ShareControls(viewer);
            var link = QueryString.Parse(await share.LinkAsync());
            var centre = viewer.Url;
            Assert.Equal(("1", Text(centre.X!.Value), Text(centre.Y!.Value)), (link["v"], link["x"], link["y"]));
            Assert.False(link.ContainsKey("ra") || link.ContainsKey("dec"));
            Assert.Equal(link, QueryString.Parse(viewer.Page.Url));
            Assert.Contains("by pixel", await viewer.Page.TextContentAsync("#share-panel [data-role=centre]"));
        }
    }

    [Fact]
    public async Task A_link_of_an_unknown_version_says_so_and_opens_the_fields_default_view()
    {
        var band = site.Demo.Bands.First(b => b.Name != site.Demo.DefaultBand).Name;
        var chip = site.Demo.Band(band).Hdus[1];
        await using var viewer = await site.OpenViewerAsync(
            $"?v=7&field={MosaicSite.DemoFieldId}&band={band}&hdu={chip.Index}&ra=10.5&dec=-3.25&z=2&stretch=log");
        await viewer.WaitForTilesAsync();
        var message = await viewer.Page.TextContentAsync("#message") ?? "";
        Assert.True(await viewer.Page.IsVisibleAsync("#message"));
        Assert.Contains("version “7”", message);
        // The field's default: its default band on the whole field, with the server's default stretch.
        var view = viewer.Url;
        Assert.Equal((MosaicSite.DemoFieldId, site.Demo.DefaultBand, true), (view.Field, view.Band, view.WholeField));
        Assert.False(QueryString.Parse(viewer.Page.Url).ContainsKey("stretch"));
        Assert.Equal("1", QueryString.Parse(viewer.Page.Url)["v"]);
        Assert.True(viewer.PageErrors.Count == 0, string.Join("\n", viewer.PageErrors));
    }

    private static string Text(double value) => value.ToString("R", Invariant);

    private static string[] SortedPaths(IReadOnlyList<TileImage> tiles) =>
        [.. tiles.Select(t => QueryString.PathAndQuery(t.Src)).Order(StringComparer.Ordinal)];

    private static async Task<Rgba32[]> MiddleScreenshotAsync(ViewerPage viewer)
    {
        var box = await viewer.MapBoxAsync();
        var png = await viewer.Page.ScreenshotAsync(new PageScreenshotOptions
        {
            Clip = new Clip { X = (float)Math.Floor(box.X + box.Width / 2 - 200), Y = (float)Math.Floor(box.Y + box.Height / 2 - 150), Width = 400, Height = 300 },
        });
        using var image = Image.Load<Rgba32>(png);
        var pixels = new Rgba32[image.Width * image.Height];
        image.CopyPixelDataTo(pixels);
        return pixels;
    }
}
