using System.Globalization;
using System.Text.RegularExpressions;
using Microsoft.Playwright;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Reference;
using Mosaic.Browser.Tests.Viewer;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Browser.Tests;

[Collection(BrowserCollection.Name)]
public sealed class PictureExportTests(MosaicSite site)
{
    [Fact]
    public async Task A_picture_at_screen_resolution_is_what_the_screen_shows_and_overlays_are_drawn_in_when_asked()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        var file = site.BandFile(band);
        // A whole zoom level: tiles sit on whole screen pixels, so the picture can match the screen pixel for pixel.
        var (cx, cy, z) = (hdu.Width / 2.0, hdu.Height / 2.0, hdu.MaxZoom + 1.0);
        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, cx, cy, z).ToQuery());
        await viewer.WaitForTilesAsync();
        var view = await viewer.MapBoxAsync();
        var mapping = new ScreenMapping(view.Width, view.Height, cx, cy, z, hdu.MaxZoom);
        await viewer.Page.Mouse.MoveAsync(1, 1);
        var screenPng = await viewer.Page.Locator("#image-view").ScreenshotAsync();
        using var screen = Image.Load<Rgba32>(screenPng);

        var plain = await SaveAsync(viewer, "screen", overlays: false);
        Assert.Equal((int)Math.Round(view.Width), plain.Width);
        Assert.Equal((int)Math.Round(view.Height), plain.Height);
        // Over the image (its outline on screen is not part of the picture), away from the compass, scale bar,
        // readout and zoom buttons drawn over the view on screen.
        var (imageLeft, imageTop) = mapping.ToContainer(0.5, hdu.Height + 0.5);
        var (imageRight, imageBottom) = mapping.ToContainer(hdu.Width + 0.5, 0.5);
        var (fromX, toX) = ((int)Math.Max(130, imageLeft + 2), (int)Math.Min(plain.Width - 130, imageRight - 2));
        var (fromY, toY) = ((int)Math.Max(130, imageTop + 2), (int)Math.Min(plain.Height - 130, imageBottom - 2));
        Assert.True(toX - fromX > 200 && toY - fromY > 200, "too little of the image to compare");
        var (different, compared) = (0, 0);
        for (var y = fromY; y < toY; y++)
        {
            for (var x = fromX; x < toX; x++)
            {
                compared++;
                if (Distance(plain[x, y], screen[x, y]) > 3) different++;
            }
        }
        Assert.True(different <= compared / 200, $"{different} of {compared} pixels differ from the screen by more than 3 levels");
        // Not a blank picture: the demo field's noise and sources vary.
        Assert.True(Spread(plain, fromX, fromY, toX, toY) > 20, "the picture shows no image");

        // A circle 3″ in radius, and every overlay.
        var centre = (X: hdu.Width / 2.0 - 20.3, Y: hdu.Height / 2.0 + 15.6);
        var sky = AstropyWcs.PixelToSky(file, hdu.Index, centre.X, centre.Y);
        var markers = new MarkerControls(viewer);
        await markers.ChooseAsync("circle", "", radius: 3);
        await markers.AddTypedAsync(string.Create(CultureInfo.InvariantCulture, $"{sky.Ra:F8} {sky.Dec:F8}"));
        await markers.CloseAsync();
        var drawn = await SaveAsync(viewer, "screen", overlays: true);
        // astropy (spherical_offsets_by, all_world2pix): the circle's point 3″ east of its centre, on screen.
        var east = SkyOffsets.Compute(file, hdu.Index, sky.Ra, sky.Dec, (3.0, 0.0)).Offsets[0];
        AssertOverlays(plain, drawn, mapping.ToContainer(east.X, east.Y), await viewer.CssColourAsync("--region"),
            await viewer.CssColourAsync("--accent"), await viewer.CssColourAsync("--text"));
        await drawn.SaveAsPngAsync("/tmp/picture-screen-overlays.png");
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task A_native_picture_is_the_visible_box_one_image_pixel_per_pixel_and_takes_overlays()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        var file = site.BandFile(band);
        var z = hdu.MaxZoom + 2.0;
        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, hdu.Width / 2.0, hdu.Height / 2.0, z).ToQuery());
        // The map's own size: whole CSS pixels (clientWidth, clientHeight), its centre at their middle.
        var size = await viewer.Page.EvalOnSelectorAsync<int[]>("#image-view", "e => [e.clientWidth, e.clientHeight]");
        var scale = Math.Pow(2, z - hdu.MaxZoom);
        // Leaflet puts the view's corner on a whole screen pixel (up to half a screen pixel off the exact centre): a
        // centre whose view edges lie at least 0.2 image pixel from a pixel's edge leaves no doubt which pixels show.
        static double EdgeGap(double edge) => Math.Abs(edge - Math.Floor(edge) - 0.5);
        double Centre(double middle, int screenPixels) => Enumerable.Range(0, 40).Select(k => middle + k * 0.025)
            .First(c => EdgeGap(c - screenPixels / 2.0 / scale) >= 0.2 && EdgeGap(c + screenPixels / 2.0 / scale) >= 0.2);
        var (cx, cy) = (Centre(hdu.Width / 2.0, size[0]), Centre(hdu.Height / 2.0, size[1]));
        await viewer.Page.GotoAsync("/" + new ViewQuery(site.Demo.Id, band, hdu.Index, cx, cy, z).ToQuery());
        await viewer.Page.WaitForFunctionAsync("() => document.querySelector('#hdu-picker').options.length > 0");
        await viewer.WaitForTilesAsync();
        var mapping = await TileMapping.ReadAsync(viewer, hdu.Height, scale);
        // The FITS pixels at least partly on screen (pixel i covers [i - 0.5, i + 0.5)), within the chip.
        var (left, top) = mapping.ToFits(0, 0);
        var (right, bottom) = mapping.ToFits(size[0], size[1]);
        var x0 = Math.Max(1, ScreenMapping.ContainingPixel(left));
        var x1 = Math.Min(hdu.Width, (int)Math.Ceiling(right + 0.5) - 1);
        var y0 = Math.Max(1, ScreenMapping.ContainingPixel(bottom));
        var y1 = Math.Min(hdu.Height, (int)Math.Ceiling(top + 0.5) - 1);

        var plain = await SaveAsync(viewer, "native", overlays: false);
        Assert.Equal(x1 - x0 + 1, plain.Width);
        Assert.Equal(y1 - y0 + 1, plain.Height);
        // The server's render.png of that box, in the page's masked colour, asked for directly.
        var mask = await viewer.CssColourAsync("--mask-colour");
        using var http = site.CreateHttpClient();
        var query = string.Create(CultureInfo.InvariantCulture,
            $"api/fields/{site.Demo.Id}/render.png?band={band}&hdu={hdu.Index}&x0={x0}&y0={y0}&x1={x1}&y1={y1}&masked={mask.R:x2}{mask.G:x2}{mask.B:x2}");
        using var rendered = Image.Load<Rgba32>(await http.GetByteArrayAsync(query));
        Assert.Equal(rendered.Width, plain.Width);
        Assert.Equal(rendered.Height, plain.Height);
        var mismatched = 0;
        for (var y = 0; y < plain.Height; y++)
            for (var x = 0; x < plain.Width; x++)
                if (!plain[x, y].Equals(rendered[x, y])) mismatched++;
        Assert.Equal(0, mismatched);

        // Right of and below the middle: clear of the compass drawn at the top left.
        var centre = (X: cx + 15.2, Y: cy - 10.3);
        var sky = AstropyWcs.PixelToSky(file, hdu.Index, centre.X, centre.Y);
        var markers = new MarkerControls(viewer);
        await markers.ChooseAsync("circle", "", radius: 6);
        await markers.AddTypedAsync(string.Create(CultureInfo.InvariantCulture, $"{sky.Ra:F8} {sky.Dec:F8}"));
        await markers.CloseAsync();
        var drawn = await SaveAsync(viewer, "native", overlays: true);
        Assert.Equal(plain.Width, drawn.Width);
        // Picture pixel (0, 0) is the top-left corner of FITS pixel (x0, y1).
        var east = SkyOffsets.Compute(file, hdu.Index, sky.Ra, sky.Dec, (6.0, 0.0)).Offsets[0];
        AssertOverlays(plain, drawn, (east.X - (x0 - 0.5), y1 + 0.5 - east.Y), await viewer.CssColourAsync("--region"),
            await viewer.CssColourAsync("--accent"), await viewer.CssColourAsync("--text"));
        await drawn.SaveAsPngAsync("/tmp/picture-native-overlays.png");
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task A_picture_of_compared_layers_is_refused_with_a_reason()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, hdu.Width / 2.0, hdu.Height / 2.0, hdu.MaxZoom).ToQuery() + "&view=blink");
        await viewer.WaitForTilesAsync();
        await viewer.Page.ClickAsync("#export-toggle");
        await viewer.Page.ClickAsync("#export-panel [data-role=save]");
        var message = await viewer.MessageAsync();
        Assert.Contains("One image", message, StringComparison.Ordinal);
    }

    [Fact]
    public async Task A_native_picture_over_fifty_megapixels_is_refused_with_a_reason_before_asking_the_server()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, hdu.Width / 2.0, hdu.Height / 2.0, hdu.MaxZoom).ToQuery());
        await viewer.WaitForTilesAsync();
        var renders = 0;
        viewer.Page.Request += (_, request) =>
        {
            if (request.Url.Contains("/render.png", StringComparison.Ordinal)) renders++;
        };
        // The demo's chips are far smaller than the limit: the page's own module is handed a box of a larger image,
        // 8000 x 6251 = 50,008,000 pixels, just over render.png's 50 megapixels (RenderEndpoints, README).
        var message = await viewer.Page.EvaluateAsync<string>(
            @"async () => {
                const { nativePicture } = await import('./export-png.js');
                const tile = document.querySelector('#image-view .image-tiles img.leaflet-tile');
                try {
                  await nativePicture({ box: { x0: 1, y0: 1, x1: 8000, y1: 6251 }, tileSrc: tile.src, placements: [] },
                    { scaleBar: false, compass: false, markers: false }, { maskColour: 'ff00ff' });
                  return 'made';
                } catch (error) { return `${error.name}: ${error.message}`; }
              }");
        Assert.StartsWith("ExportError: ", message, StringComparison.Ordinal);
        Assert.Contains("8000 × 6251", message, StringComparison.Ordinal);
        Assert.Contains("50 megapixels", message, StringComparison.Ordinal);
        Assert.Equal(0, renders);
    }

    /// <summary>Saves a picture through the panel and decodes the download (ImageSharp).</summary>
    [Fact]
    public async Task A_FITS_cutout_of_the_view_opens_in_astropy_with_the_original_values_and_WCS()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        var file = site.BandFile(band);
        var (cx, cy) = (hdu.Width / 2.0 + 10.3, hdu.Height / 2.0 - 7.6);
        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, cx, cy, hdu.MaxZoom + 3.0).ToQuery());
        await viewer.WaitForTilesAsync();
        var page = viewer.Page;
        if (await page.IsHiddenAsync("#export-panel")) await page.ClickAsync("#export-toggle");
        var download = await page.RunAndWaitForDownloadAsync(() => page.ClickAsync("#export-panel [data-role=cutout]"));
        var name = Regex.Match(download.SuggestedFilename, @"-x(\d+)-(\d+)-y(\d+)-(\d+)\.fits$");
        Assert.True(name.Success, $"the cutout's name '{download.SuggestedFilename}' does not give its box");
        int Part(int group) => int.Parse(name.Groups[group].Value, CultureInfo.InvariantCulture);
        var (x0, x1, y0, y1) = (Part(1), Part(2), Part(3), Part(4));
        // The visible box: it holds the view's centre and, at 8 screen pixels per image pixel, is narrower than the chip.
        Assert.InRange(cx, x0, x1);
        Assert.InRange(cy, y0, y1);
        Assert.True(x1 - x0 + 1 < hdu.Width && x1 - x0 > 50, $"box x {x0}-{x1}");
        var path = await download.PathAsync();

        // astropy.io.fits reads the cutout's pixel (i, j) as the original's (x0 - 1 + i, y0 - 1 + j) (FITS 4.0 section
        // 3.3.2: the first pixel of the data is (1, 1)).
        var (w, h) = (x1 - x0 + 1, y1 - y0 + 1);
        foreach (var (i, j) in new[] { (1, 1), (w, h), (w / 2 + 1, h / 3 + 1) })
            Assert.Equal(AstropyFits.Pixel(file, hdu.Index, x0 - 1 + i, y0 - 1 + j).Value, AstropyFits.Pixel(path, 0, i, j).Value);
        // astropy.wcs of the cutout (CRPIX shifted, distortion kept) and of the original agree on the same pixels.
        var cut = AstropyWcs.PixelToSky(path, 0, [(1.0, 1.0), (w, h), (w / 2.0, 1.0)]);
        var original = AstropyWcs.PixelToSky(file, hdu.Index, [(x0, y0), (x1, y1), (x0 - 1 + w / 2.0, y0)]);
        for (var k = 0; k < cut.Count; k++)
        {
            Assert.Equal(original[k].Ra, cut[k].Ra, 1e-9);
            Assert.Equal(original[k].Dec, cut[k].Dec, 1e-9);
        }
        Assert.Empty(viewer.PageErrors);
    }

    private static async Task<Image<Rgba32>> SaveAsync(ViewerPage viewer, string resolution, bool overlays)
    {
        var page = viewer.Page;
        if (await page.IsHiddenAsync("#export-panel")) await page.ClickAsync("#export-toggle");
        await page.CheckAsync($"#export-panel input[name=export-resolution][value={resolution}]");
        foreach (var role in new[] { "scale-bar", "compass", "markers" })
            await page.SetCheckedAsync($"#export-panel [data-role={role}]", overlays);
        var download = await page.RunAndWaitForDownloadAsync(() => page.ClickAsync("#export-panel [data-role=save]"));
        Assert.EndsWith($"-{resolution}.png", download.SuggestedFilename, StringComparison.Ordinal);
        var bytes = await File.ReadAllBytesAsync(await download.PathAsync());
        // A PNG signature (PNG specification, section 5.2), then ImageSharp decodes it.
        Assert.Equal(new byte[] { 0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A }, bytes[..8]);
        await page.ClickAsync("#export-toggle");
        return Image.Load<Rgba32>(bytes);
    }

    // The demo field is drawn in gray (R = G = B): pixels near the marker, compass or label colours, which are not
    // gray, can only be the overlays.
    private static void AssertOverlays(Image<Rgba32> plain, Image<Rgba32> drawn, (double X, double Y) onCircle, Rgba32 region, Rgba32 accent, Rgba32 text)
    {
        var (px, py) = ((int)Math.Floor(onCircle.X), (int)Math.Floor(onCircle.Y));
        Assert.True(Near(drawn, px - 2, py - 2, px + 3, py + 3, region, 45) > 0, $"no marker-coloured pixel around ({px}, {py})");
        Assert.Equal(0, Near(plain, px - 2, py - 2, px + 3, py + 3, region, 45));
        // The compass (top left): the north arrow and its letter in the accent colour.
        Assert.True(Near(drawn, 12, 12, 108, 108, accent, 30) > 20, "no compass drawn in");
        Assert.Equal(0, Near(plain, 12, 12, 108, 108, accent, 30));
        // The scale bar (bottom right): its label and bracket in the text colour.
        var (w, h) = (drawn.Width, drawn.Height);
        Assert.True(Near(drawn, Math.Max(0, w - 200), Math.Max(0, h - 60), w, h, text, 20, minRedOverBlue: 8) > 20, "no scale bar drawn in");
        Assert.Equal(0, Near(plain, Math.Max(0, w - 200), Math.Max(0, h - 60), w, h, text, 20, minRedOverBlue: 8));
    }

    private static int Near(Image<Rgba32> image, int x0, int y0, int x1, int y1, Rgba32 colour, int tolerance, int minRedOverBlue = 0)
    {
        var count = 0;
        for (var y = Math.Max(0, y0); y < Math.Min(image.Height, y1); y++)
        {
            for (var x = Math.Max(0, x0); x < Math.Min(image.Width, x1); x++)
            {
                var p = image[x, y];
                if (Distance(p, colour) <= tolerance && p.R - p.B >= minRedOverBlue) count++;
            }
        }
        return count;
    }

    private static int Distance(Rgba32 a, Rgba32 b) => Math.Max(Math.Abs(a.R - b.R), Math.Max(Math.Abs(a.G - b.G), Math.Abs(a.B - b.B)));

    private static int Spread(Image<Rgba32> image, int x0, int y0, int x1, int y1)
    {
        var (low, high) = (255, 0);
        for (var y = y0; y < y1; y++)
            for (var x = x0; x < x1; x++)
                (low, high) = (Math.Min(low, image[x, y].R), Math.Max(high, image[x, y].R));
        return high - low;
    }
}
