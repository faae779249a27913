using System.Globalization;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Reference;
using Mosaic.Browser.Tests.Viewer;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Browser.Tests;

/// <summary>
/// Colour composites in the browser (colour contract, issue 5): the colour panel writes the composite into the page
/// URL and the tile URLs, and the colours on screen follow the channel assignment. Screen colours are checked
/// against astropy.visualization.make_lupton_rgb (Lupton et al. 2004; Debian python3-astropy) and, per band,
/// against the display contract's linear curve applied to pixel values astropy.io.fits reads.
/// </summary>
[Collection(BrowserCollection.Name)]
public sealed class ColourCompositeTests(MosaicSite site)
{
    // make_lupton_rgb converts to 8 bits in its own way; the contract allows 1 DN, and a screen pixel read back
    // through Chromium's compositor may differ by one more (common practice for screenshot comparisons).
    private const int Tolerance = 2;

    [Fact]
    public async Task A_lupton_composite_takes_its_bands_by_wavelength_follows_a_swap_and_reopens_from_its_url()
    {
        var field = await ColourField.EnsureAsync(site);
        await using var viewer = await site.OpenViewerAsync($"?field={field.Id}");
        await viewer.WaitForTilesAsync($"band={ColourField.Long}");

        await viewer.Page.CheckAsync("input[name=colour-mode][value=lupton]");
        await viewer.WaitForTilesAsync("rgb=lupton");
        var url = QueryString.Parse(viewer.Page.Url);
        // The names say 650, 550 and 450 nm: the longest wavelength is red, the shortest blue (client README).
        Assert.Equal(("lupton", ColourField.Long, ColourField.Middle, ColourField.Short), (url["rgb"], url["red"], url["green"], url["blue"]));
        // A composite takes no palette: the palette choices are off while it shows.
        Assert.True(await viewer.Page.EvalOnSelectorAllAsync<bool>("input[name=palette]", "all => all.length > 0 && all.every(r => r.disabled)"));
        var tiles = await viewer.WaitForTilesAsync("rgb=lupton");
        Assert.All(tiles, t => Assert.DoesNotContain("palette=", t.Src));

        var resolved = await ResolvedLuptonAsync(field, ColourField.Long, ColourField.Middle, ColourField.Short);
        var mapping = await ColourScreen.MappingAsync(viewer, field.Chip.MaxZoom);
        var before = new Dictionary<string, Rgba32>();
        foreach (var (band, (x, y)) in field.Sources)
        {
            var seen = await ColourScreen.AtPixelAsync(viewer, mapping, x, y);
            before[band] = seen;
            var expected = AstropyColour.Lupton(field.Folder, (ColourField.Long, ColourField.Middle, ColourField.Short), resolved.Q, resolved.Range, resolved.Min, x, y);
            AssertColour(expected, seen, $"source of {band} at ({x}, {y})");
        }
        // Each source is bright in one band only, so it shows in that band's channel alone.
        Assert.True(Dominant(before[ColourField.Long]) == 'R', $"{before[ColourField.Long]}");
        Assert.True(Dominant(before[ColourField.Middle]) == 'G', $"{before[ColourField.Middle]}");
        Assert.True(Dominant(before[ColourField.Short]) == 'B', $"{before[ColourField.Short]}");
        // Masked in one band is masked in the composite: the page's masked colour shows through.
        var maskColour = await viewer.CssColourAsync("--mask-colour");
        var masked = await ColourScreen.AtPixelAsync(viewer, mapping, field.Masked.X, field.Masked.Y);
        AssertColour((maskColour.R, maskColour.G, maskColour.B), masked, "masked square");
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/colour-client-lupton.png" });

        // Swap red and blue: the long band's source turns blue, the short one's red; green stays.
        await viewer.Page.ClickAsync("[data-role=swap-red-blue]");
        await viewer.WaitForTilesAsync($"red={ColourField.Short}");
        url = QueryString.Parse(viewer.Page.Url);
        Assert.Equal((ColourField.Short, ColourField.Middle, ColourField.Long), (url["red"], url["green"], url["blue"]));
        mapping = await ColourScreen.MappingAsync(viewer, field.Chip.MaxZoom);
        foreach (var (band, (x, y)) in field.Sources)
        {
            var seen = await ColourScreen.AtPixelAsync(viewer, mapping, x, y);
            var old = before[band];
            AssertColour((old.B, old.G, old.R), seen, $"source of {band} after the swap");
        }
        var swappedTiles = await viewer.WaitForTilesAsync($"red={ColourField.Short}");

        // The link opens the same composite in a new context: the same tiles, the same colours, the same panel.
        await using var restored = await site.OpenViewerAsync(new Uri(viewer.Page.Url).Query);
        var restoredTiles = await restored.WaitForTilesAsync($"red={ColourField.Short}");
        Assert.Equal(Sorted(swappedTiles), Sorted(restoredTiles));
        Assert.True(await restored.Page.IsCheckedAsync("input[name=colour-mode][value=lupton]"));
        Assert.Equal(ColourField.Short, await restored.Page.InputValueAsync(".channel-row[data-channel=red] select"));
        var restoredMapping = await ColourScreen.MappingAsync(restored, field.Chip.MaxZoom);
        var (lx, ly) = field.Sources[ColourField.Long];
        var again = await ColourScreen.AtPixelAsync(restored, restoredMapping, lx, ly);
        Assert.Equal('B', Dominant(again));
        Assert.Empty(viewer.FailedTileRequests);
        Assert.Empty(viewer.PageErrors);
        Assert.Empty(restored.PageErrors);
    }

    [Fact]
    public async Task Lupton_parameters_typed_in_the_panel_reach_the_url_the_tiles_and_the_screen()
    {
        var field = await ColourField.EnsureAsync(site);
        var bands = (ColourField.Long, ColourField.Middle, ColourField.Short);
        await using var viewer = await site.OpenViewerAsync(
            $"?field={field.Id}&rgb=lupton&red={bands.Item1}&green={bands.Item2}&blue={bands.Item3}");
        await viewer.WaitForTilesAsync("rgb=lupton");

        // A range far above the sources' brightness (400 above the sky) keeps them unsaturated: their colour is
        // then the asinh curve's, not the clip's.
        await viewer.Page.FillAsync("input[data-param=range]", "4000");
        await viewer.Page.PressAsync("input[data-param=range]", "Enter");
        await viewer.WaitForTilesAsync("range=4000");
        await viewer.Page.FillAsync("input[data-param=q]", "2");
        await viewer.Page.PressAsync("input[data-param=q]", "Enter");
        await viewer.WaitForTilesAsync("q=2");
        await viewer.Page.FillAsync("input[data-param=green-min]", "0");
        await viewer.Page.PressAsync("input[data-param=green-min]", "Enter");
        var tiles = await viewer.WaitForTilesAsync("min=");

        var url = QueryString.Parse(viewer.Page.Url);
        Assert.Equal(("4000", "2"), (url["range"], url["q"]));
        var minima = url["min"].Split(',').Select(v => double.Parse(v, CultureInfo.InvariantCulture)).ToArray();
        Assert.Equal(3, minima.Length);
        Assert.Equal(0, minima[1]);
        Assert.All(tiles, t => Assert.Equal(url["min"], QueryString.Parse(t.Src)["min"]));

        var mapping = await ColourScreen.MappingAsync(viewer, field.Chip.MaxZoom);
        foreach (var (band, (x, y)) in field.Sources)
        {
            var expected = AstropyColour.Lupton(field.Folder, bands, 2, 4000, minima, x, y);
            AssertColour(expected, await ColourScreen.AtPixelAsync(viewer, mapping, x, y), $"source of {band}");
        }
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task A_per_band_composite_stretches_each_channel_with_its_own_limits_and_takes_channel_limits_from_the_panel()
    {
        var field = await ColourField.EnsureAsync(site);
        // Channels on purpose not in wavelength order; shared limits by share of the pixels, which a channel's own
        // value limits then replace.
        var bands = (Red: ColourField.Middle, Green: ColourField.Short, Blue: ColourField.Long);
        const string shared = "stretch=linear&limits=percentile&plo=1&phi=99.9";
        await using var viewer = await site.OpenViewerAsync(
            $"?field={field.Id}&rgb=each&red={bands.Red}&green={bands.Green}&blue={bands.Blue}&{shared}");
        await viewer.WaitForTilesAsync("rgb=each");
        Assert.True(await viewer.Page.IsCheckedAsync("input[name=colour-mode][value=each]"));

        var display = await site.GetJsonAsync(
            $"api/fields/{field.Id}/display?rgb=each&red={bands.Red}&green={bands.Green}&blue={bands.Blue}&hdu={field.Chip.Index}&{shared}");
        (double Lo, double Hi) Limits(string channel)
        {
            var c = display.GetProperty("channels").GetProperty(channel);
            return (c.GetProperty("lo").GetDouble(), c.GetProperty("hi").GetDouble());
        }
        var mapping = await ColourScreen.MappingAsync(viewer, field.Chip.MaxZoom);
        var (sx, sy) = field.Sources[ColourField.Long];
        var seen = await ColourScreen.AtPixelAsync(viewer, mapping, sx, sy);
        var expected = (
            Linear(PixelValue(field, bands.Red, sx, sy), Limits("red")),
            Linear(PixelValue(field, bands.Green, sx, sy), Limits("green")),
            Linear(PixelValue(field, bands.Blue, sx, sy), Limits("blue")));
        AssertColour(expected, seen, "source of the long band, shown in blue");
        Assert.Equal('B', Dominant(seen));

        // The blue channel's own limits from its boxes: 0 to 1000, so the source (about 410) is no longer clipped.
        await viewer.Page.FillAsync("input[data-param=blue-lo]", "0");
        await viewer.Page.PressAsync("input[data-param=blue-lo]", "Enter");
        await viewer.Page.FillAsync("input[data-param=blue-hi]", "1000");
        await viewer.Page.PressAsync("input[data-param=blue-hi]", "Enter");
        var tiles = await viewer.WaitForTilesAsync("blue-hi=1000");
        var url = QueryString.Parse(viewer.Page.Url);
        Assert.Equal(("value", "0", "1000"), (url["blue-limits"], url["blue-lo"], url["blue-hi"]));
        Assert.All(tiles, t => Assert.Equal("1000", QueryString.Parse(t.Src)["blue-hi"]));
        mapping = await ColourScreen.MappingAsync(viewer, field.Chip.MaxZoom);
        seen = await ColourScreen.AtPixelAsync(viewer, mapping, sx, sy);
        AssertColour(expected with { Item3 = Linear(PixelValue(field, bands.Blue, sx, sy), (0, 1000)) }, seen, "blue channel with its own limits");
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/colour-client-each.png" });
        Assert.Empty(viewer.FailedTileRequests);
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task A_link_naming_a_band_the_field_lacks_says_so_and_bands_on_different_grids_are_refused_in_words()
    {
        var field = await ColourField.EnsureAsync(site);
        await using var viewer = await site.OpenViewerAsync(
            $"?field={field.Id}&rgb=lupton&red=nonesuch&green={ColourField.Middle}&blue={ColourField.Short}");
        // The default red band stands in, and the message line names the band asked for.
        var tiles = await viewer.WaitForTilesAsync("rgb=lupton");
        Assert.All(tiles, t => Assert.Equal(ColourField.Long, QueryString.Parse(t.Src)["red"]));
        var text = await viewer.Page.InnerTextAsync("#message");
        Assert.Contains("nonesuch", text);

        // Two bands of other sizes (written by astropy.io.fits): the server refuses the composite (colour contract:
        // 422, different pixel grids) and the page says why instead of showing nothing.
        var folder = Path.Combine(site.DataDirectory, "mismatch");
        Mosaic.Testing.DebianPython.RunCode(
            "import sys, os, numpy as np\nfrom astropy.io import fits\nos.makedirs(sys.argv[1], exist_ok=True)\n" +
            "for name, width in (('wide', 96), ('narrow', 64)):\n" +
            "    data = (10 + np.random.default_rng(7).standard_normal((64, width))).astype(np.float32)\n" +
            "    fits.HDUList([fits.PrimaryHDU(), fits.ImageHDU(data, name='SKY')]).writeto(os.path.join(sys.argv[1], name + '.fits'), overwrite=True)\n",
            [folder]);
        var deadline = DateTime.UtcNow + TimeSpan.FromMinutes(1);
        while (true)
        {
            try
            {
                var info = FieldInfo.Parse(await site.GetJsonAsync("api/fields/mismatch"));
                if (info.Bands.Count == 2 && info.Bands.All(b => b.Hdus.All(h => h.PyramidState == "ready"))) break;
            }
            catch (InvalidOperationException) when (DateTime.UtcNow < deadline)
            {
                // Not scanned yet.
            }
            Assert.True(DateTime.UtcNow < deadline, "the mismatched field never became ready");
            await Task.Delay(250);
        }
        await using var refused = await site.OpenViewerAsync("?field=mismatch&rgb=lupton&red=wide&green=narrow&blue=narrow");
        await refused.Page.WaitForFunctionAsync("() => !document.querySelector('#message').hidden && /grid/i.test(document.querySelector('#message').textContent)");
        Assert.Contains("different pixel grids", await refused.Page.InnerTextAsync("#message"));
        Assert.Empty(viewer.PageErrors);
    }

    private async Task<(double Q, double Range, double[] Min)> ResolvedLuptonAsync(ColourField field, string red, string green, string blue)
    {
        var dto = await site.GetJsonAsync($"api/fields/{field.Id}/display?rgb=lupton&red={red}&green={green}&blue={blue}&hdu={field.Chip.Index}");
        var lupton = dto.GetProperty("lupton");
        return (lupton.GetProperty("q").GetDouble(), lupton.GetProperty("range").GetDouble(),
            [.. lupton.GetProperty("min").EnumerateArray().Select(v => v.GetDouble())]);
    }

    private static double PixelValue(ColourField field, string band, int x, int y) =>
        AstropyFits.Pixel(Path.Combine(field.Folder, band + ".fits"), 1, x, y).Value
        ?? throw new InvalidOperationException($"pixel ({x}, {y}) of {band} is masked");

    // Display contract (issue 3): linear t = clip((v - lo) / (hi - lo), 0, 1), DN = round(255 t).
    private static byte Linear(double value, (double Lo, double Hi) limits) =>
        (byte)Math.Round(255 * Math.Clamp((value - limits.Lo) / (limits.Hi - limits.Lo), 0, 1), MidpointRounding.AwayFromZero);

    private static char Dominant(Rgba32 c)
    {
        // One channel far above both others.
        if (c.R > c.G + 100 && c.R > c.B + 100) return 'R';
        if (c.G > c.R + 100 && c.G > c.B + 100) return 'G';
        if (c.B > c.R + 100 && c.B > c.G + 100) return 'B';
        return '?';
    }

    private static void AssertColour((byte R, byte G, byte B) expected, Rgba32 seen, string what)
    {
        Assert.True(Math.Abs(expected.R - seen.R) <= Tolerance && Math.Abs(expected.G - seen.G) <= Tolerance && Math.Abs(expected.B - seen.B) <= Tolerance,
            $"{what}: expected ({expected.R}, {expected.G}, {expected.B}), on screen ({seen.R}, {seen.G}, {seen.B})");
    }

    private static List<string> Sorted(IEnumerable<TileImage> tiles) =>
        [.. tiles.Select(t => QueryString.PathAndQuery(t.Src)).Order(StringComparer.Ordinal)];
}
