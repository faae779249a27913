using System.Globalization;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Viewer;

namespace Mosaic.Browser.Tests;

[Collection(BrowserCollection.Name)]
public sealed class ViewUrlTests(MosaicSite site)
{
    // The client pans this many screen pixels per arrow key press (its documented keyboard step).
    private const double KeyPanPixels = 120;

    [Fact]
    public async Task Zooming_and_panning_change_the_url_and_the_url_opens_the_same_view_in_a_new_context()
    {
        var band = site.Demo.Bands.First(b => b.Name != site.Demo.DefaultBand).Name;
        var hdu = site.Demo.Band(band).Hdus.Last();
        Assert.NotEqual(site.Demo.DefaultHdu, hdu.Index);

        await using var viewer = await site.OpenViewerAsync();
        await viewer.WaitForTilesAsync();

        // Another band and chip through the pickers.
        await viewer.Page.SelectOptionAsync("#band-picker", band);
        await viewer.WaitForTilesAsync($"band={band}");
        await viewer.Page.SelectOptionAsync("#hdu-picker", hdu.Index.ToString(CultureInfo.InvariantCulture));
        await viewer.WaitForTilesAsync($"hdu={hdu.Index}");
        var start = viewer.Url;
        Assert.Equal((band, hdu.Index), (start.Band, start.Hdu));
        Assert.True(start is { X: not null, Y: not null, Z: not null }, $"no view in {viewer.Page.Url}");

        // Zoom with the + button: four presses of half a level each, far enough in that the view is well inside
        // the area the image can be panned over.
        var zoomed = start;
        for (var press = 0; press < 4; press++)
        {
            await viewer.Page.ClickAsync(".leaflet-control-zoom-in");
            zoomed = await viewer.WaitForUrlChangeAsync(zoomed);
        }
        Assert.Equal(start.Z!.Value + 2, zoomed.Z!.Value, 2);

        // Pan with the keyboard: right moves the centre to higher x, up to higher y (north up).
        // Leaflet keeps the map's pixel origin whole, so a centre may move by up to a screen pixel more or less.
        var scale = Math.Pow(2, zoomed.Z.Value - hdu.MaxZoom);
        var onePixel = 1 / scale;
        await viewer.Page.FocusAsync("#image-view");
        await viewer.Page.Keyboard.PressAsync("ArrowRight");
        var right = await viewer.WaitForUrlChangeAsync(zoomed);
        Assert.InRange(right.X!.Value - zoomed.X!.Value, KeyPanPixels / scale - onePixel, KeyPanPixels / scale + onePixel);
        Assert.InRange(right.Y!.Value - zoomed.Y!.Value, -onePixel, onePixel);
        await viewer.Page.Keyboard.PressAsync("ArrowUp");
        var up = await viewer.WaitForUrlChangeAsync(right);
        Assert.InRange(up.Y!.Value - right.Y!.Value, KeyPanPixels / scale - onePixel, KeyPanPixels / scale + onePixel);
        Assert.InRange(up.X!.Value - right.X!.Value, -onePixel, onePixel);

        // Drag with the mouse: dragging the image left brings higher x to the centre.
        var box = await viewer.MapBoxAsync();
        await viewer.PointAtAsync(box.Width / 2, box.Height / 2);
        await viewer.Page.Mouse.DownAsync();
        await viewer.PointAtAsync(box.Width / 2 - 60, box.Height / 2);
        await viewer.PointAtAsync(box.Width / 2 - 90, box.Height / 2);
        await viewer.Page.WaitForTimeoutAsync(200); // a still pointer at release: no inertia fling
        await viewer.Page.Mouse.UpAsync();
        var dragged = await viewer.WaitForUrlChangeAsync(up);
        Assert.True(dragged.X > up.X, $"x {up.X} -> {dragged.X} after dragging left");
        await viewer.WaitForTilesAsync();
        var shared = viewer.Page.Url;
        var view = viewer.Url;

        // The link in a new browser context (no shared state) opens the same field, band, chip, centre and zoom.
        await using var restored = await site.OpenViewerAsync(new Uri(shared).Query);
        var tiles = await restored.WaitForTilesAsync($"hdu={hdu.Index}");
        Assert.Equal(view, restored.Url);
        Assert.Equal(MosaicSite.DemoFieldId, await restored.Page.InputValueAsync("#field-picker"));
        Assert.Equal(band, await restored.Page.InputValueAsync("#band-picker"));
        Assert.Equal(hdu.Index.ToString(CultureInfo.InvariantCulture), await restored.Page.InputValueAsync("#hdu-picker"));
        // Tiles of the zoom level Leaflet picks for that zoom (rounded, at most native).
        var tileZoom = Math.Clamp((int)Math.Round(view.Z!.Value, MidpointRounding.AwayFromZero), 0, hdu.MaxZoom);
        Assert.All(tiles, t => Assert.Contains($"/{tileZoom}/", new Uri(t.Src).AbsolutePath));

        // What is on screen: the pixel at the view's middle and one 150 screen pixels right and 100 up of it are
        // where the URL's centre and zoom put them (pointing at pixel centres, away from pixel edges).
        var restoredBox = await restored.MapBoxAsync();
        var mapping = new ScreenMapping(restoredBox.Width, restoredBox.Height, view.X!.Value, view.Y!.Value, view.Z.Value, hdu.MaxZoom);
        foreach (var (sx, sy) in new[] { (0.0, 0.0), (150.0, -100.0) })
        {
            var (fx, fy) = mapping.ToFits(restoredBox.Width / 2 + sx, restoredBox.Height / 2 + sy);
            var (px, py) = (ScreenMapping.ContainingPixel(fx), ScreenMapping.ContainingPixel(fy));
            var (cx, cy) = mapping.ToContainer(px, py);
            await restored.PointAtAsync(cx, cy);
            var readout = await restored.ReadoutAsync();
            Assert.Equal((px.ToString(CultureInfo.InvariantCulture), py.ToString(CultureInfo.InvariantCulture)), (readout.X, readout.Y));
        }
        Assert.Empty(viewer.FailedTileRequests);
        Assert.Empty(restored.FailedTileRequests);
        Assert.Empty(restored.PageErrors);
    }
}
