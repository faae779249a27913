using System.Globalization;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Reference;
using Mosaic.Browser.Tests.Viewer;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Browser.Tests;

[Collection(BrowserCollection.Name)]
public sealed class PixelReadoutTests(MosaicSite site)
{
    // Three zoom levels past native: an image pixel is 8 x 8 screen pixels. Leaflet rounds the map's origin and
    // mouse events carry whole CSS pixels, so the pointer lands up to ~1 screen pixel from where the contract's
    // mapping puts it; every point below is at least 1.6 screen pixels inside the pixel meant.
    private const int ZoomPastNative = 3;

    [Fact]
    public async Task The_readout_shows_x_y_and_the_value_astropy_reads_for_the_pixel_under_the_pointer()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        var file = site.BandFile(band);
        // A star's peak: a pixel whose value differs plainly from its neighbours.
        var peak = AstropyFits.Brightest(file, hdu.Index, margin: 8);
        var extName = AstropyFits.Header(file, hdu.Index, "EXTNAME");
        var bunit = AstropyFits.Header(file, hdu.Index, "BUNIT");
        var z = hdu.MaxZoom + ZoomPastNative;

        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, peak.X, peak.Y, z).ToQuery());
        await viewer.WaitForTilesAsync();
        var box = await viewer.MapBoxAsync();
        var mapping = new ScreenMapping(box.Width, box.Height, peak.X, peak.Y, z, hdu.MaxZoom);

        // Offsets in FITS pixels from the peak's centre; ±0.3 stays in the pixel, 0.7 is in the next one, and +y
        // is up on screen (north up).
        (double Dx, double Dy, int Px, int Py)[] points =
        [
            (0, 0, peak.X, peak.Y),
            (0.3, -0.3, peak.X, peak.Y),
            (0.7, 0, peak.X + 1, peak.Y),
            (-0.3, 0.7, peak.X, peak.Y + 1),
            (0, 1, peak.X, peak.Y + 1),
            (-2, -3, peak.X - 2, peak.Y - 3),
        ];
        foreach (var (dx, dy, px, py) in points)
        {
            var (cx, cy) = mapping.ToContainer(peak.X + dx, peak.Y + dy);
            await viewer.PointAtAsync(cx, cy);
            var readout = await viewer.ReadoutAsync();
            var expected = AstropyFits.Pixel(file, hdu.Index, px, py);

            Assert.Equal(extName, readout.Hdu);
            Assert.Equal(px.ToString(CultureInfo.InvariantCulture), readout.X);
            Assert.Equal(py.ToString(CultureInfo.InvariantCulture), readout.Y);
            Assert.Equal("value", readout.Kind);
            Assert.NotNull(expected.Value);
            // astropy.io.fits (Debian python3-astropy): the file's float32 value, compared at float32 precision.
            Assert.Equal((float)expected.Value.Value, (float)readout.RawValue!.Value);
            // The visible text: 7 significant digits (float32 carries about 7.2: common practice), then BUNIT.
            var text = readout.ValueText;
            if (bunit is { Length: > 0 })
            {
                Assert.EndsWith(" " + bunit, text);
                text = text[..^(bunit.Length + 1)];
            }
            var shown = double.Parse(text, CultureInfo.InvariantCulture);
            Assert.True(Math.Abs(shown - expected.Value.Value) <= 1e-6 * Math.Abs(expected.Value.Value),
                $"shown {readout.ValueText}, astropy {expected.Value.Value:R}");
        }
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task A_masked_pixel_reads_masked_and_shows_the_mask_colour_while_outside_the_image_shows_another()
    {
        var band = site.Demo.DefaultBand;
        var file = site.BandFile(band);
        var (hdu, mx, my) = site.FirstMaskedPixel(band);
        Assert.Null(AstropyFits.Pixel(file, hdu.Index, mx, my).Value);
        var z = hdu.MaxZoom + ZoomPastNative;

        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, mx, my, z).ToQuery());
        await viewer.WaitForTilesAsync();
        var box = await viewer.MapBoxAsync();
        var mapping = new ScreenMapping(box.Width, box.Height, mx, my, z, hdu.MaxZoom);

        var (cx, cy) = mapping.ToContainer(mx, my);
        await viewer.PointAtAsync(cx, cy);
        var readout = await viewer.ReadoutAsync();
        Assert.Equal(("masked", mx.ToString(CultureInfo.InvariantCulture), my.ToString(CultureInfo.InvariantCulture)),
            (readout.Kind, readout.X, readout.Y));
        Assert.Equal("masked", readout.ValueText);
        await viewer.SaveScreenshotAsync("masked-pixel");

        var maskColour = await viewer.CssColourAsync("--mask-colour");
        var outsideColour = await viewer.CssColourAsync("--outside");
        // The mask colour is far from every gray level (r = g = b): its channels differ by a wide margin.
        Assert.True(Chroma(maskColour) >= 96, $"mask colour {maskColour} is too close to a gray");
        AssertClose(maskColour, await viewer.ScreenColourAsync(cx, cy));

        // Outside the image: no value, and the neutral outside colour, not the mask colour. Zoomed right out, the
        // image is a small block in the middle and the view's left edge is outside it.
        var before = viewer.Url;
        await viewer.Page.Mouse.WheelAsync(0, 3000);
        await viewer.WaitForUrlChangeAsync(before);
        await viewer.WaitForTilesAsync();
        await viewer.PointAtAsync(4, box.Height / 2);
        var outside = await viewer.ReadoutAsync();
        Assert.Equal("outside", outside.Kind);
        Assert.True(int.Parse(outside.X, CultureInfo.InvariantCulture) < 1, $"x = {outside.X} should be left of the image");
        Assert.True(Distance(maskColour, outsideColour) > 100, "outside and mask colours must be told apart");
        AssertClose(outsideColour, await viewer.ScreenColourAsync(4, box.Height / 2));
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task Worked_from_the_keyboard_the_readout_follows_the_middle_of_the_view()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        var file = site.BandFile(band);
        var peak = AstropyFits.Brightest(file, hdu.Index, margin: 40);
        // A quarter pixel off the peak's centre, so the centre is nowhere near a pixel edge before or after the
        // arrow key's whole number of screen pixels.
        await using var viewer = await site.OpenViewerAsync(
            new ViewQuery(site.Demo.Id, band, hdu.Index, peak.X + 0.25, peak.Y - 0.25, hdu.MaxZoom + ZoomPastNative).ToQuery());
        await viewer.WaitForTilesAsync();
        var before = viewer.Url;

        await viewer.Page.FocusAsync("#image-view");
        await viewer.Page.Keyboard.PressAsync("ArrowLeft");
        var after = await viewer.WaitForUrlChangeAsync(before);
        Assert.True(after.X < before.X, $"x {before.X} -> {after.X} after the left arrow");

        var readout = await viewer.ReadoutAsync();
        var (px, py) = (ScreenMapping.ContainingPixel(after.X!.Value), ScreenMapping.ContainingPixel(after.Y!.Value));
        Assert.Equal((px.ToString(CultureInfo.InvariantCulture), py.ToString(CultureInfo.InvariantCulture)), (readout.X, readout.Y));
        var expected = AstropyFits.Pixel(file, hdu.Index, px, py);
        // astropy.io.fits (Debian python3-astropy) for the pixel now in the middle.
        if (expected.Value is null)
            Assert.Equal("masked", readout.Kind);
        else
            Assert.Equal((float)expected.Value.Value, (float)readout.RawValue!.Value);
        Assert.True(await viewer.Page.Locator("#image-view.keyboard-probe").IsVisibleAsync(), "the crosshair marks the probed point");
    }

    private static int Chroma(Rgba32 c) => Math.Max(c.R, Math.Max(c.G, c.B)) - Math.Min(c.R, Math.Min(c.G, c.B));

    private static double Distance(Rgba32 a, Rgba32 b) =>
        Math.Sqrt(Math.Pow(a.R - b.R, 2) + Math.Pow(a.G - b.G, 2) + Math.Pow(a.B - b.B, 2));

    private static void AssertClose(Rgba32 expected, Rgba32 actual) =>
        Assert.True(Distance(expected, actual) <= 3, $"expected {expected} on screen, found {actual}");
}
