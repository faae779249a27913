using System.Globalization;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Reference;
using Mosaic.Browser.Tests.Viewer;

namespace Mosaic.Browser.Tests;

[Collection(BrowserCollection.Name)]
public sealed class HduPickerTests(MosaicSite site)
{
    [Fact]
    public async Task The_chip_picker_lists_the_whole_field_then_the_image_hdus_by_extname_and_picking_one_loads_its_tiles()
    {
        var band = site.Demo.Band(site.Demo.DefaultBand);
        var file = site.BandFile(band.Name);
        await using var viewer = await site.OpenViewerAsync();
        await viewer.WaitForTilesAsync("hdu=canvas");

        // The whole field first, then every image HDU, each under its EXTNAME as astropy.io.fits (Debian
        // python3-astropy) reads it.
        var options = await viewer.Page.EvalOnSelectorAllAsync<string[][]>("#hdu-picker option", "os => os.map(o => [o.value, o.textContent])");
        Assert.Equal(["canvas", "Whole field"], options[0]);
        var chips = options[1..];
        Assert.Equal(band.Hdus.Select(h => h.Index.ToString(CultureInfo.InvariantCulture)), chips.Select(o => o[0]));
        foreach (var option in chips)
            Assert.Equal(AstropyFits.Header(file, int.Parse(option[0], CultureInfo.InvariantCulture), "EXTNAME"), option[1]);

        var other = band.Hdus.First(h => h.Index != site.Demo.DefaultHdu && h.Index != band.Hdus[0].Index);
        await viewer.Page.SelectOptionAsync("#hdu-picker", other.Index.ToString(CultureInfo.InvariantCulture));
        var tiles = await viewer.WaitForTilesAsync($"hdu={other.Index}");
        await viewer.SaveScreenshotAsync("other-chip");

        Assert.NotEmpty(tiles);
        Assert.All(tiles, tile =>
        {
            Assert.True(tile.Loaded, $"tile not loaded: {tile.Src}");
            Assert.Equal((256, 256), (tile.NaturalWidth, tile.NaturalHeight));
        });
        Assert.Empty(viewer.FailedTileRequests);
        Assert.Equal(other.Index, viewer.Url.Hdu);
        Assert.False(viewer.Url.WholeField);
        // Outlines belong to the whole field: on one chip there are none to show.
        Assert.True(await viewer.Page.Locator("#outline-toggle").IsDisabledAsync());

        // The readout now names that chip and reads its pixels: the value at the view's middle is astropy's value
        // for that pixel of that HDU. Zoomed in first (+ key, four half levels), so a pixel is several screen
        // pixels wide and the pointer cannot miss it.
        var zoomed = viewer.Url;
        await viewer.Page.FocusAsync("#image-view");
        for (var press = 0; press < 4; press++)
        {
            await viewer.Page.Keyboard.PressAsync("+");
            zoomed = await viewer.WaitForUrlChangeAsync(zoomed);
        }
        await viewer.WaitForTilesAsync($"hdu={other.Index}");
        var view = viewer.Url;
        var box = await viewer.MapBoxAsync();
        var mapping = new ScreenMapping(box.Width, box.Height, view.X!.Value, view.Y!.Value, view.Z!.Value, other.MaxZoom);
        var (px, py) = (ScreenMapping.ContainingPixel(view.X.Value), ScreenMapping.ContainingPixel(view.Y.Value));
        var (cx, cy) = mapping.ToContainer(px, py);
        await viewer.PointAtAsync(cx, cy);
        var readout = await viewer.ReadoutAsync();
        var expected = AstropyFits.Pixel(file, other.Index, px, py);
        Assert.Equal(AstropyFits.Header(file, other.Index, "EXTNAME"), readout.Hdu);
        Assert.Equal((px.ToString(CultureInfo.InvariantCulture), py.ToString(CultureInfo.InvariantCulture)), (readout.X, readout.Y));
        if (expected.Value is null)
            Assert.Equal("masked", readout.Kind);
        else
            Assert.Equal((float)expected.Value.Value, (float)readout.RawValue!.Value);

        // And back to the whole field from the picker.
        await viewer.Page.SelectOptionAsync("#hdu-picker", "canvas");
        await viewer.WaitForTilesAsync("hdu=canvas");
        Assert.True(viewer.Url.WholeField);
        Assert.False(await viewer.Page.Locator("#outline-toggle").IsDisabledAsync());
        Assert.Empty(viewer.PageErrors);
    }
}
