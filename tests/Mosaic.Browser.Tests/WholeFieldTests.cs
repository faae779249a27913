using System.Globalization;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Reference;
using Mosaic.Browser.Tests.Viewer;

namespace Mosaic.Browser.Tests;

/// <summary>
/// The whole camera field (`hdu=canvas`): every chip of a band on one sky grid, opened by default, with the
/// original chip, its pixel and its value under the pointer. Chip pixels are checked against astropy.wcs
/// (WCS.all_world2pix / all_pix2world, SIP included) and values against astropy.io.fits, Debian python3-astropy.
/// </summary>
[Collection(BrowserCollection.Name)]
public sealed class WholeFieldTests(MosaicSite site)
{
    // An image pixel is 8 x 8 screen pixels: the pointer lands well inside the pixel meant.
    private const int ZoomPastNative = 3;

    [Fact]
    public async Task The_whole_field_opens_by_default_and_its_outlines_name_every_chip_and_survive_a_reload()
    {
        var band = site.Demo.Band(site.Demo.DefaultBand);
        var canvas = band.WholeField;
        var file = site.BandFile(band.Name);
        // Every image HDU of the band is placed, each under its EXTNAME as astropy.io.fits reads it.
        Assert.Equal(band.Hdus.Select(h => h.Index), canvas.Chips.Select(c => c.Hdu).Order());
        Assert.Empty(canvas.Excluded);
        foreach (var chip in canvas.Chips) Assert.Equal(AstropyFits.Header(file, chip.Hdu, "EXTNAME"), chip.Name);

        await using var viewer = await site.OpenViewerAsync();
        var tiles = await viewer.WaitForTilesAsync("hdu=canvas");
        Assert.All(tiles, t => Assert.True(t.Loaded, $"tile not loaded: {t.Src}"));
        Assert.True(viewer.Url.WholeField, $"not on the whole field: {viewer.Page.Url}");
        Assert.Equal(band.Name, viewer.Url.Band);
        Assert.Equal("canvas", await viewer.Page.InputValueAsync("#hdu-picker"));
        Assert.Equal("Whole field", (await viewer.Page.TextContentAsync("#hdu-picker option:first-child"))!.Trim());
        Assert.Equal("Whole field", (await viewer.ReadoutHduAsync()).Trim());

        // Outlines: off until asked for, then one per chip, named, and in the URL.
        Assert.False(await viewer.OutlinesPressedAsync());
        Assert.Empty(await viewer.OutlinesAsync());
        await viewer.Page.ClickAsync("#outline-toggle");
        await viewer.WaitForOutlinesAsync(canvas.Chips.Count);
        Assert.True(await viewer.OutlinesPressedAsync());
        Assert.Equal("1", QueryString.Parse(viewer.Page.Url)["outlines"]);
        var drawn = await viewer.OutlinesAsync();
        Assert.Equal(canvas.Chips.Select(c => (c.Hdu, c.Name)).Order(), drawn.Select(o => (o.Hdu, o.Name)).Order());
        Assert.Equal(canvas.Chips.Select(c => c.Name).Order(), (await viewer.OutlineLabelsAsync()).Order());

        // Each outline where the view's centre and zoom (from the URL) put its canvas pixels on screen.
        var view = viewer.Url;
        var box = await viewer.MapBoxAsync();
        var mapping = new ScreenMapping(box.Width, box.Height, view.X!.Value, view.Y!.Value, view.Z!.Value, canvas.MaxZoom);
        foreach (var chip in canvas.Chips)
        {
            var outline = drawn.Single(o => o.Hdu == chip.Hdu);
            var (left, top) = mapping.ToContainer(chip.MinX, chip.MaxY);
            var (right, bottom) = mapping.ToContainer(chip.MaxX, chip.MinY);
            // Leaflet rounds the map's origin and path points to whole screen pixels.
            Assert.True(Math.Abs(outline.Left - left) <= 2 && Math.Abs(outline.Right - right) <= 2
                && Math.Abs(outline.Top - top) <= 2 && Math.Abs(outline.Bottom - bottom) <= 2,
                $"{chip.Name} drawn at ({outline.Left}, {outline.Top})-({outline.Right}, {outline.Bottom}), expected ({left}, {top})-({right}, {bottom})");
        }

        // The sky tools work on the whole field too: grid and compass come from /sky with hdu=canvas.
        await viewer.Page.ClickAsync("#grid-toggle");
        await viewer.WaitForGridAsync();
        Assert.True(await viewer.Page.Locator("#compass").IsVisibleAsync());
        Assert.True(await viewer.Page.Locator("#scale-bar").IsVisibleAsync());
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/canvas-client-whole-field.png" });

        // The link opens the whole field with its outlines again, in a fresh browser context.
        await using (var reloaded = await site.OpenViewerAsync(new Uri(viewer.Page.Url).Query))
        {
            await reloaded.WaitForTilesAsync("hdu=canvas");
            await reloaded.WaitForOutlinesAsync(canvas.Chips.Count);
            Assert.True(await reloaded.OutlinesPressedAsync());
            Assert.True(reloaded.Url.WholeField);

            // Another band keeps the whole field and its outlines (every band of the field shares one grid).
            var other = site.Demo.Bands.First(b => b.Name != band.Name);
            await reloaded.Page.SelectOptionAsync("#band-picker", other.Name);
            await reloaded.WaitForTilesAsync($"band={other.Name}");
            Assert.True(reloaded.Url.WholeField, $"left the whole field: {reloaded.Page.Url}");
            Assert.All(await reloaded.TilesAsync(), t => Assert.Contains("hdu=canvas", t.Src));
            await reloaded.WaitForOutlinesAsync(other.WholeField.Chips.Count);

            await reloaded.Page.ClickAsync("#outline-toggle");
            await reloaded.WaitForOutlinesAsync(0);
            Assert.False(QueryString.Parse(reloaded.Page.Url).ContainsKey("outlines"));
            Assert.Empty(reloaded.PageErrors);
        }
        Assert.Empty(viewer.FailedTileRequests);
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task Over_a_chip_the_readout_names_it_with_the_chip_pixel_astropy_gives_and_its_original_value()
    {
        var band = site.Demo.Band(site.Demo.DefaultBand);
        var canvas = band.WholeField;
        var file = site.BandFile(band.Name);
        var chip = canvas.Chips[canvas.Chips.Count / 2];
        // A canvas pixel well inside the chip's outline, and a point off its centre.
        var px = (int)Math.Round(chip.MinX + (chip.MaxX - chip.MinX) * 0.35);
        var py = (int)Math.Round(chip.MinY + (chip.MaxY - chip.MinY) * 0.6);
        Assert.True(chip.Contains(px, py), $"({px}, {py}) is not inside {chip.Name}'s outline");
        var (ax, ay) = (px + 0.2, py - 0.15);
        var z = canvas.MaxZoom + ZoomPastNative;

        await using var viewer = await site.OpenViewerAsync(ViewQuery.OnWholeField(site.Demo.Id, band.Name, px, py, z).ToQuery());
        await viewer.WaitForTilesAsync("hdu=canvas");
        var box = await viewer.MapBoxAsync();
        var mapping = new ScreenMapping(box.Width, box.Height, px, py, z, canvas.MaxZoom);
        var (cx, cy) = mapping.ToContainer(ax, ay);
        await viewer.PointAtAsync(cx, cy);
        var readout = await viewer.ReadoutAsync();
        // The sky row's point is the one under the pointer on the whole field (within ~1 screen pixel).
        var sky = await viewer.SkyReadoutNearAsync(ax, ay, tolerance: 0.2);

        Assert.Equal(chip.Name, readout.Hdu);
        Assert.Equal("sky", sky.Kind);
        Assert.Equal((px.ToString(CultureInfo.InvariantCulture), py.ToString(CultureInfo.InvariantCulture)), await viewer.CanvasPixelAsync());
        var (chipX, chipY) = await viewer.ChipPositionAsync();
        Assert.NotNull(chipX);
        Assert.NotNull(chipY);

        // astropy.wcs all_world2pix on the chip's own header (SIP included) of the RA/Dec the readout shows: the
        // chip position the readout reports. Six decimals of a degree are 3.6 mas, under 0.015 chip pixel at the
        // demo's 0.25″ per pixel.
        var expected = AstropyWcs.SkyToPixel(file, chip.Hdu, Degrees(sky.RaDegrees), Degrees(sky.DecDegrees));
        Assert.True(expected.OnChip, $"astropy puts the point at ({expected.X}, {expected.Y}), off {chip.Name}");
        Assert.Equal(expected.X, chipX.Value, 0.03);
        Assert.Equal(expected.Y, chipY.Value, 0.03);
        // The pixel shown is the chip pixel that holds that position (pixel i covers [i - 0.5, i + 0.5)).
        var (cpx, cpy) = (ScreenMapping.ContainingPixel(chipX.Value), ScreenMapping.ContainingPixel(chipY.Value));
        Assert.Equal((cpx.ToString(CultureInfo.InvariantCulture), cpy.ToString(CultureInfo.InvariantCulture)), (readout.X, readout.Y));

        // The original value of that chip pixel as astropy.io.fits reads it, not a resampled one.
        var value = AstropyFits.Pixel(file, chip.Hdu, cpx, cpy);
        if (value.Value is null)
        {
            Assert.Equal("masked", readout.Kind);
        }
        else
        {
            Assert.Equal("value", readout.Kind);
            Assert.Equal((float)value.Value.Value, (float)readout.RawValue!.Value);
        }
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/canvas-client-readout.png" });
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task Between_chips_the_readout_says_gap_and_astropy_puts_the_point_on_no_chip()
    {
        var band = site.Demo.Band(site.Demo.DefaultBand);
        var canvas = band.WholeField;
        var file = site.BandFile(band.Name);
        var (gx, gy) = GapPoint(canvas);
        var z = canvas.MaxZoom + ZoomPastNative;

        await using var viewer = await site.OpenViewerAsync(ViewQuery.OnWholeField(site.Demo.Id, band.Name, gx, gy, z).ToQuery());
        await viewer.WaitForTilesAsync("hdu=canvas");
        var box = await viewer.MapBoxAsync();
        await viewer.PointAtAsync(box.Width / 2, box.Height / 2);
        var readout = await viewer.ReadoutAsync();
        var sky = await viewer.SkyReadoutAsync();

        Assert.Equal("gap", readout.Kind);
        Assert.Equal("gap", readout.Hdu);
        Assert.Equal(("–", "–"), (readout.X, readout.Y));
        Assert.Equal((null, null), await viewer.ChipPositionAsync());
        // RA/Dec are still given in a gap, and astropy.wcs all_world2pix puts that position on none of the chips.
        Assert.Equal("sky", sky.Kind);
        foreach (var chip in canvas.Chips)
        {
            var position = AstropyWcs.SkyToPixel(file, chip.Hdu, Degrees(sky.RaDegrees), Degrees(sky.DecDegrees));
            Assert.False(position.OnChip, $"astropy puts the gap point at ({position.X}, {position.Y}) on {chip.Name}");
        }
        // No-data, not masked: the gap shows the page's outside colour (app.css --outside), not the masked colour.
        var outside = await viewer.CssColourAsync("--outside");
        var shown = await viewer.ScreenColourAsync(box.Width / 2 + 3, box.Height / 2 + 3);
        Assert.True(Math.Abs(outside.R - shown.R) <= 2 && Math.Abs(outside.G - shown.G) <= 2 && Math.Abs(outside.B - shown.B) <= 2,
            $"the gap is drawn {shown}, not the outside colour {outside}");
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/canvas-client-gap.png" });
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task Go_to_on_the_whole_field_stays_on_it_and_centres_the_position_on_its_chip()
    {
        var band = site.Demo.Band(site.Demo.DefaultBand);
        var canvas = band.WholeField;
        var file = site.BandFile(band.Name);
        var chip = canvas.Chips[1];
        var hdu = band.Hdu(chip.Hdu);
        // 0.4 pixel from the nearest pixel edge each way, so the pixel holding it is plain.
        var (tx, ty) = (Math.Floor(hdu.Width * 0.3) + 0.1, Math.Floor(hdu.Height * 0.6) - 0.1);
        // astropy.wcs all_pix2world (Debian python3-astropy): the sky position of that chip point.
        var target = AstropyWcs.PixelToSky(file, chip.Hdu, tx, ty);
        var z = canvas.MaxZoom + ZoomPastNative;

        await using var viewer = await site.OpenViewerAsync(
            ViewQuery.OnWholeField(site.Demo.Id, band.Name, canvas.Width / 2.0, canvas.Height / 2.0, z).ToQuery());
        await viewer.WaitForTilesAsync("hdu=canvas");
        var before = viewer.Url;
        await viewer.GoToAsync(string.Create(CultureInfo.InvariantCulture, $"{target.Ra:F8} {target.Dec:F8}"));
        var moved = await viewer.WaitForUrlChangeAsync(before);
        await viewer.WaitForTilesAsync("hdu=canvas");
        moved = viewer.Url;
        Assert.True(moved.WholeField, $"left the whole field: {viewer.Page.Url}");
        Assert.Equal("canvas", await viewer.Page.InputValueAsync("#hdu-picker"));
        Assert.Equal(before.Z, moved.Z);

        var box = await viewer.MapBoxAsync();
        var mark = await viewer.MarkerCentreAsync();
        Assert.NotNull(mark);
        // Leaflet places markers on whole screen pixels.
        Assert.True(Math.Abs(mark.X - box.Width / 2) <= 1.5 && Math.Abs(mark.Y - box.Height / 2) <= 1.5,
            $"mark at ({mark.X}, {mark.Y}), view middle ({box.Width / 2}, {box.Height / 2})");

        // At the view's middle now: that chip, at that chip position (an eighth of a pixel per screen pixel here).
        await viewer.PointAtAsync(box.Width / 2, box.Height / 2);
        var readout = await viewer.ReadoutAsync();
        Assert.Equal(chip.Name, readout.Hdu);
        var (chipX, chipY) = await viewer.ChipPositionAsync();
        Assert.Equal(tx, chipX!.Value, 0.25);
        Assert.Equal(ty, chipY!.Value, 0.25);
        Assert.Equal((ScreenMapping.ContainingPixel(tx).ToString(CultureInfo.InvariantCulture), ScreenMapping.ContainingPixel(ty).ToString(CultureInfo.InvariantCulture)),
            (readout.X, readout.Y));
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/canvas-client-goto.png" });
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task A_chip_left_off_the_whole_field_is_named_with_the_reason_and_the_rest_is_outlined()
    {
        var field = await site.WaitForFieldAsync(MosaicSite.PartlySolvedFieldId);
        var band = Assert.Single(field.Bands);
        var canvas = band.WholeField;
        var file = Path.Combine(site.DataDirectory, MosaicSite.PartlySolvedFieldId + ".fits");
        // The chip written without WCS keywords (see MosaicSite), by the EXTNAME astropy.io.fits reads.
        var left = Assert.Single(canvas.Excluded);
        Assert.Equal(AstropyFits.Header(file, 3, "EXTNAME"), left.Name);
        Assert.False(string.IsNullOrWhiteSpace(left.Reason));
        Assert.Equal([AstropyFits.Header(file, 1, "EXTNAME"), AstropyFits.Header(file, 2, "EXTNAME")], canvas.Chips.Select(c => c.Name).Order());

        await using var viewer = await site.OpenViewerAsync($"?field={MosaicSite.PartlySolvedFieldId}&outlines=1");
        await viewer.WaitForTilesAsync("hdu=canvas");
        await viewer.WaitForOutlinesAsync(2);
        var note = viewer.Page.Locator("#canvas-note");
        Assert.True(await note.IsVisibleAsync());
        Assert.Equal("1 chip left off", (await note.TextContentAsync())!.Trim());
        var title = await note.GetAttributeAsync("title") ?? "";
        Assert.Contains(left.Name, title, StringComparison.Ordinal);
        Assert.Contains(left.Reason, title, StringComparison.Ordinal);
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/canvas-client-left-off.png" });

        // The chip left off is still there to pick on its own; then there are no outlines to draw, and no note.
        await viewer.Page.SelectOptionAsync("#hdu-picker", left.Hdu.ToString(CultureInfo.InvariantCulture));
        await viewer.WaitForTilesAsync($"hdu={left.Hdu}");
        Assert.True(await viewer.Page.Locator("#outline-toggle").IsDisabledAsync());
        await viewer.WaitForOutlinesAsync(0);
        Assert.True(await note.IsHiddenAsync());
        Assert.Empty(viewer.FailedTileRequests);
        Assert.Empty(viewer.PageErrors);
    }

    /// <summary>
    /// A canvas point midway between two chips that sit side by side (the nearest such pair), inside neither
    /// outline: a gap between chips.
    /// </summary>
    private static (double X, double Y) GapPoint(CanvasInfo canvas)
    {
        var candidates =
            from a in canvas.Chips
            from b in canvas.Chips
            where a.MaxX < b.MinX
            let y0 = Math.Max(a.MinY, b.MinY)
            let y1 = Math.Min(a.MaxY, b.MaxY)
            where y1 - y0 > 40
            let x = Math.Round((a.MaxX + b.MinX) / 2)
            let y = Math.Round((y0 + y1) / 2)
            where b.MinX - a.MaxX >= 4 && canvas.Chips.All(c => !c.Contains(x, y))
            orderby b.MinX - a.MaxX
            select (x, y);
        foreach (var point in candidates) return point;
        throw new InvalidOperationException("no two chips of the whole field sit side by side with a gap between them");
    }

    /// <summary>Decimal degrees as the readout shows them ("37.812500°", "−21.450000°").</summary>
    private static double Degrees(string text) =>
        double.Parse(text.TrimEnd('°').Replace('\u2212', '-'), NumberStyles.Float, CultureInfo.InvariantCulture);
}
