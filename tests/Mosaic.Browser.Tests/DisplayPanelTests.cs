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
/// The display panel against the display contract of issue 3: every setting is in the page URL and in every tile
/// URL, and the tiles, histogram and colour bar follow it. PNGs are decoded with ImageSharp (a general-purpose
/// decoder); FITS headers are read with astropy.io.fits (Debian python3-astropy).
/// </summary>
[Collection(BrowserCollection.Name)]
public sealed class DisplayPanelTests(MosaicSite site)
{
    private const string ColourBar = "[data-role=colour-bar]";
    private const string Histogram = "[data-role=histogram]";

    [Fact]
    public async Task Changing_the_stretch_changes_the_tile_pixels_the_tile_urls_and_the_page_url()
    {
        await using var viewer = await site.OpenViewerAsync();
        var before = await viewer.WaitForTilesAsync();
        Assert.DoesNotContain("stretch", QueryString.Parse(viewer.Page.Url).Keys);

        await viewer.Page.SelectOptionAsync("#stretch-picker", "linear");
        var after = await viewer.WaitForTilesAsync("stretch=linear");

        Assert.Equal("linear", QueryString.Parse(viewer.Page.Url)["stretch"]);
        using var http = site.CreateHttpClient();
        var changed = 0;
        foreach (var tile in before)
        {
            var path = new Uri(tile.Src).AbsolutePath;
            var again = after.SingleOrDefault(t => new Uri(t.Src).AbsolutePath == path);
            if (again is null) continue;
            // Display contract: masked pixels stay transparent in tiles; the page paints its own colour under them.
            Assert.Equal("transparent", QueryString.Parse(again.Src)["masked"]);
            using var oldImage = Image.Load<Rgba32>(await http.GetByteArrayAsync(new Uri(tile.Src)));
            using var newImage = Image.Load<Rgba32>(await http.GetByteArrayAsync(new Uri(again.Src)));
            changed += DifferingPixels(oldImage, newImage);
        }
        Assert.True(changed > 0, "no tile pixel changed from the default asinh to a linear stretch");

        // A parameter from its box: the power curve's exponent, committed with Enter.
        await viewer.Page.SelectOptionAsync("#stretch-picker", "power");
        await viewer.WaitForTilesAsync("stretch=power");
        await viewer.Page.FillAsync("input[data-param=gamma]", "3");
        await viewer.Page.PressAsync("input[data-param=gamma]", "Enter");
        var powered = await viewer.WaitForTilesAsync("gamma=3");
        var url = QueryString.Parse(viewer.Page.Url);
        Assert.Equal(("power", "3"), (url["stretch"], url["gamma"]));
        Assert.All(powered, t => Assert.Contains("stretch=power", t.Src));
        Assert.Empty(viewer.FailedTileRequests);
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task Reloading_the_url_restores_the_panel_and_requests_the_same_tile_urls()
    {
        var palettes = await site.GetJsonAsync("api/palettes");
        var palette = palettes.EnumerateArray().Select(p => p.GetProperty("name").GetString()!).First(n => n != "gray");

        await using var viewer = await site.OpenViewerAsync();
        await viewer.WaitForTilesAsync();
        await viewer.Page.SelectOptionAsync("#stretch-picker", "power");
        await viewer.Page.FillAsync("input[data-param=gamma]", "0.75");
        await viewer.Page.PressAsync("input[data-param=gamma]", "Enter");
        await viewer.WaitForTilesAsync("gamma=0.75");
        await viewer.Page.ClickAsync("[data-share='99.9']");
        await viewer.WaitForTilesAsync("limits=percentile");
        await viewer.Page.CheckAsync($"input[name=palette][value='{palette}']");
        var tiles = await viewer.WaitForTilesAsync($"palette={palette}");

        var url = QueryString.Parse(viewer.Page.Url);
        // The 99.9 % preset is the central 99.9 % of the pixels: percentiles 0.05 and 99.95.
        Assert.Equal(("power", "0.75", "percentile", "0.05", "99.95", palette),
            (url["stretch"], url["gamma"], url["limits"], url["plo"], url["phi"], url["palette"]));
        var shared = new Uri(viewer.Page.Url).Query;

        await using var restored = await site.OpenViewerAsync(shared);
        var restoredTiles = await restored.WaitForTilesAsync($"palette={palette}");
        Assert.Equal(Sorted(tiles), Sorted(restoredTiles));
        Assert.Equal("power", await restored.Page.InputValueAsync("#stretch-picker"));
        Assert.Equal("0.75", await restored.Page.InputValueAsync("input[data-param=gamma]"));
        Assert.Equal("true", await restored.Page.GetAttributeAsync("[data-share='99.9']", "aria-pressed"));
        Assert.Equal("false", await restored.Page.GetAttributeAsync("[data-share='99']", "aria-pressed"));
        Assert.True(await restored.Page.IsCheckedAsync("input[name=limit-mode][value=percentile]"));
        Assert.True(await restored.Page.IsCheckedAsync($"input[name=palette][value='{palette}']"));
        Assert.Equal(viewer.Page.Url, restored.Page.Url);
        Assert.Empty(restored.FailedTileRequests);
        Assert.Empty(restored.PageErrors);
    }

    [Fact]
    public async Task Picking_a_palette_colours_the_tiles_with_that_palettes_colours()
    {
        var palettes = await site.GetJsonAsync("api/palettes");
        // A palette with colour in it (some entry whose channels differ), from the server's own list.
        var palette = palettes.EnumerateArray().First(p => Colours(p).Any(c => c.R != c.G || c.G != c.B));
        var name = palette.GetProperty("name").GetString()!;
        var allowed = Colours(palette).ToArray();
        var largestStep = allowed.Zip(allowed.Skip(1), Step).Max();

        await using var viewer = await site.OpenViewerAsync();
        var grayTiles = await viewer.WaitForTilesAsync();
        using var http = site.CreateHttpClient();
        using (var gray = Image.Load<Rgba32>(await http.GetByteArrayAsync(new Uri(grayTiles[0].Src))))
        {
            // Display contract: the default palette is gray, DN = round(255 t), so every drawn pixel has r = g = b.
            Assert.All(OpaquePixels(gray), p => Assert.True(p.R == p.G && p.G == p.B, $"{p} is not gray"));
        }

        await viewer.Page.CheckAsync($"input[name=palette][value='{name}']");
        var coloured = await viewer.WaitForTilesAsync($"palette={name}");
        Assert.Equal(name, QueryString.Parse(viewer.Page.Url)["palette"]);
        var chromatic = 0;
        foreach (var tile in coloured)
        {
            using var image = Image.Load<Rgba32>(await http.GetByteArrayAsync(new Uri(tile.Src)));
            foreach (var p in OpaquePixels(image))
            {
                // A tile may sample the palette at other levels than the 256 listed, so each colour must lie on the
                // palette's curve: no farther from a listed colour than two neighbouring listed colours are apart.
                var nearest = allowed.Min(c => Step(c, new Rgb24(p.R, p.G, p.B)));
                Assert.True(nearest <= largestStep, $"{p} is {nearest} from every colour of palette {name}");
                if (p.R != p.G || p.G != p.B) chromatic++;
            }
        }
        Assert.True(chromatic > 0, $"no tile pixel is coloured with palette {name}");
        await viewer.SaveScreenshotAsync("display-panel-palette");
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task Dragging_the_high_limit_on_the_histogram_sets_value_limits_in_the_url_and_the_tiles()
    {
        var band = site.Demo.DefaultBand;
        var resolved = await site.GetJsonAsync($"api/fields/{MosaicSite.DemoFieldId}/display?band={band}");
        var (lo, hi) = (resolved.GetProperty("lo").GetDouble(), resolved.GetProperty("hi").GetDouble());

        await using var viewer = await site.OpenViewerAsync();
        await viewer.WaitForTilesAsync();
        var handle = viewer.Page.Locator("[data-role=hi-handle]");
        await viewer.Page.WaitForSelectorAsync($"{Histogram}[data-ready] [data-role=hi-handle]:not([hidden])");
        var (rangeLo, rangeHi) = await HistogramRangeAsync(viewer);
        var canvas = await viewer.Page.Locator($"{Histogram} canvas").BoundingBoxAsync() ?? throw new InvalidOperationException("no histogram");
        var box = await handle.BoundingBoxAsync() ?? throw new InvalidOperationException("no high handle");
        var valuePerPixel = (rangeHi - rangeLo) / canvas.Width;

        // The marker stands at the server's high limit (display contract: /display gives the limits in use).
        var handleX = box.X + box.Width / 2;
        Assert.InRange(handleX, canvas.X + (hi - rangeLo) / valuePerPixel - 1.5, canvas.X + (hi - rangeLo) / valuePerPixel + 1.5);

        var y = box.Y + box.Height / 2;
        await viewer.Page.Mouse.MoveAsync(handleX, y);
        await viewer.Page.Mouse.DownAsync();
        var target = handleX - Math.Min(40, (handleX - canvas.X) / 2);
        await viewer.Page.Mouse.MoveAsync((float)((handleX + target) / 2), y, new MouseMoveOptions { Steps = 4 });
        await viewer.Page.Mouse.MoveAsync((float)target, y, new MouseMoveOptions { Steps = 4 });
        await viewer.Page.Mouse.UpAsync();
        await viewer.Page.WaitForFunctionAsync("() => new URLSearchParams(location.search).get('limits') === 'value'");
        var url = QueryString.Parse(viewer.Page.Url);
        // Tiles asked for while the handle moved give way to those of where it was let go.
        var tiles = await viewer.WaitForTilesAsync($"hi={Uri.EscapeDataString(url["hi"])}");

        Assert.Equal("value", url["limits"]);
        var newLo = double.Parse(url["lo"], CultureInfo.InvariantCulture);
        var newHi = double.Parse(url["hi"], CultureInfo.InvariantCulture);
        // The low limit stays the one in use, written to 7 significant digits (float32 precision: common practice).
        Assert.Equal(lo, newLo, Math.Abs(lo) * 1e-6 + 1e-12);
        // The high limit is the value under the pointer where it was let go, within one screen pixel.
        var expectedHi = rangeLo + (Math.Floor(target) - canvas.X) * valuePerPixel;
        Assert.InRange(newHi, expectedHi - 1.5 * valuePerPixel, expectedHi + 1.5 * valuePerPixel);
        Assert.True(newHi < hi, $"high limit {hi} -> {newHi} after dragging left");
        Assert.All(tiles, t =>
        {
            var query = QueryString.Parse(t.Src);
            Assert.Equal((url["lo"], url["hi"]), (query["lo"], query["hi"]));
        });
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task The_colour_bar_shows_the_display_the_server_resolves_labelled_in_bunit()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.DefaultHdu;
        const string display = "stretch=log&a=300&palette=cubehelix&ch-rot=0.75";
        await using var viewer = await site.OpenViewerAsync($"?field={MosaicSite.DemoFieldId}&band={band}&hdu={hdu}&{display}");
        await viewer.WaitForTilesAsync("a=300");
        var resolved = await site.GetJsonAsync($"api/fields/{MosaicSite.DemoFieldId}/display?band={band}&{display}");
        var key = resolved.GetProperty("key").GetString()!;
        await viewer.Page.WaitForFunctionAsync("key => document.querySelector('[data-role=colour-bar]').dataset.key === key", key);

        // BUNIT as astropy.io.fits reads it from the band's file (Debian python3-astropy).
        var bunit = AstropyFits.Header(site.BandFile(band), hdu, "BUNIT");
        Assert.False(string.IsNullOrEmpty(bunit), "the demo band has no BUNIT to label the colour bar with");
        Assert.Equal(bunit, await viewer.Page.TextContentAsync("[data-role=colour-bar-unit]"));

        var values = resolved.GetProperty("colorbar").GetProperty("values").EnumerateArray().Select(v => v.GetDouble()).ToArray();
        var colours = resolved.GetProperty("colorbar").GetProperty("colors").EnumerateArray().Select(c => Hex(c.GetString()!)).ToArray();
        Assert.Equal((256, 256), (values.Length, colours.Length));
        var ticks = await viewer.Page.EvalOnSelectorAllAsync<string[][]>($"{ColourBar} .colour-bar-tick",
            "ticks => ticks.map(t => [t.dataset.value, t.dataset.t, t.textContent])");
        Assert.True(ticks.Length >= 2, "the colour bar has fewer than two ticks");
        var tickValues = ticks.Select(t => double.Parse(t[0], CultureInfo.InvariantCulture)).ToArray();
        // The ends are the limits /display resolved.
        Assert.Equal(resolved.GetProperty("lo").GetDouble(), tickValues[0]);
        Assert.Equal(resolved.GetProperty("hi").GetDouble(), tickValues[^1]);
        for (var i = 0; i < ticks.Length; i++)
        {
            var value = tickValues[i];
            // Each tick stands where its value falls on the /display colour bar (t = i / 255 at values[i]).
            Assert.Equal(PositionOf(values, value), double.Parse(ticks[i][1], CultureInfo.InvariantCulture), 1e-9);
            // Its label reads as its value: the ends to 5 significant digits, inner ticks exactly.
            var shown = double.Parse(ticks[i][2], CultureInfo.InvariantCulture);
            var tolerance = i == 0 || i == ticks.Length - 1 ? 5e-5 * Math.Abs(value) : 1e-9 * Math.Abs(value);
            Assert.Equal(value, shown, tolerance);
            if (i > 0) Assert.True(value > tickValues[i - 1], $"tick values not increasing: {string.Join(", ", tickValues)}");
        }

        // The strip on screen is the /display colours, low limit at the left.
        var png = await viewer.Page.Locator($"{ColourBar} canvas").ScreenshotAsync();
        using var strip = Image.Load<Rgba32>(png);
        var inner = strip.Width - 2; // a 1 px border each side
        foreach (var i in new[] { 3, 64, 128, 191, 252 })
        {
            var x = 1 + (int)Math.Floor((i + 0.5) * inner / 256.0);
            var p = strip[x, strip.Height / 2];
            // Scaled without smoothing, a screen column shows colour i or, at a column's edge, a neighbour.
            var near = colours[(i - 1)..(i + 2)];
            Assert.True(near.Any(c => Math.Abs(p.R - c.R) <= 2 && Math.Abs(p.G - c.G) <= 2 && Math.Abs(p.B - c.B) <= 2),
                $"colour {i}: {colours[i]} from /display, {p} on screen");
        }
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task The_masked_colour_repaints_masked_pixels_lives_in_the_page_url_and_leaves_tile_urls_alone()
    {
        var band = site.Demo.DefaultBand;
        var (hdu, mx, my) = site.FirstMaskedPixel(band);
        var z = hdu.MaxZoom + 3;

        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, mx, my, z).ToQuery());
        var before = await viewer.WaitForTilesAsync();
        var box = await viewer.MapBoxAsync();
        var (cx, cy) = new ScreenMapping(box.Width, box.Height, mx, my, z, hdu.MaxZoom).ToContainer(mx, my);

        var chosen = new Rgba32(0x1f, 0xd0, 0xa0, 255);
        await viewer.Page.FillAsync("#mask-colour", "#1fd0a0");
        await viewer.Page.WaitForFunctionAsync("() => new URLSearchParams(location.search).get('masked') === '1fd0a0'");
        AssertClose(chosen, await viewer.ScreenColourAsync(cx, cy));
        var after = await viewer.TilesAsync();
        Assert.Equal(Sorted(before), Sorted(after));
        Assert.All(after, t => Assert.Equal("transparent", QueryString.Parse(t.Src)["masked"]));

        await using var restored = await site.OpenViewerAsync(new Uri(viewer.Page.Url).Query);
        await restored.WaitForTilesAsync();
        Assert.Equal("#1fd0a0", await restored.Page.InputValueAsync("#mask-colour"));
        AssertClose(chosen, await restored.ScreenColourAsync(cx, cy));
        Assert.Empty(restored.PageErrors);
    }

    [Fact]
    public async Task Limits_taken_from_the_view_are_the_stats_of_the_pixels_on_screen_applied_as_values()
    {
        var band = site.Demo.DefaultBand;
        var hdu = site.Demo.Band(band).Hdu(site.Demo.DefaultHdu);
        var z = hdu.MaxZoom + 3;
        var scale = Math.Pow(2, z - hdu.MaxZoom);

        // First a view to learn the map's size, then a centre that puts every edge of the view well inside a pixel
        // (away from the pixel edges at k + 0.5), so the visible box does not hang on Leaflet's rounding.
        await using var probe = await site.OpenViewerAsync();
        var size = await probe.MapBoxAsync();
        var cx = CentreAwayFromEdges(hdu.Width / 2.0, size.Width / 2 / scale);
        var cy = CentreAwayFromEdges(hdu.Height / 2.0, size.Height / 2 / scale);

        await using var viewer = await site.OpenViewerAsync(new ViewQuery(site.Demo.Id, band, hdu.Index, cx, cy, z).ToQuery());
        await viewer.WaitForTilesAsync();
        var asked = new List<string>();
        viewer.Page.Request += (_, request) =>
        {
            if (request.Url.Contains("/stats?", StringComparison.Ordinal)) asked.Add(request.Url);
        };
        await viewer.Page.ClickAsync("#limits-from-view");
        var tiles = await viewer.WaitForTilesAsync("limits=value");
        var url = QueryString.Parse(viewer.Page.Url);

        // Pixel i covers [i - 0.5, i + 0.5) (the client's documented convention); the view spans centre ± half size.
        var x0 = (int)Math.Floor(cx - size.Width / 2 / scale + 0.5);
        var x1 = (int)Math.Floor(cx + size.Width / 2 / scale + 0.5);
        var y0 = (int)Math.Floor(cy - size.Height / 2 / scale + 0.5);
        var y1 = (int)Math.Floor(cy + size.Height / 2 / scale + 0.5);
        Assert.True(x0 >= 1 && y0 >= 1 && x1 <= hdu.Width && y1 <= hdu.Height, "the view should lie inside the chip");
        var request = QueryString.Parse(Assert.Single(asked));
        Assert.Equal((x0, y0, x1, y1), (int.Parse(request["x0"], CultureInfo.InvariantCulture), int.Parse(request["y0"], CultureInfo.InvariantCulture),
            int.Parse(request["x1"], CultureInfo.InvariantCulture), int.Parse(request["y1"], CultureInfo.InvariantCulture)));
        var stats = await site.GetJsonAsync(
            $"api/fields/{MosaicSite.DemoFieldId}/stats?band={band}&hdu={hdu.Index}&x0={x0}&y0={y0}&x1={x1}&y1={y1}");
        Assert.True(stats.GetProperty("exact").GetBoolean());
        var percentiles = stats.GetProperty("percentiles");
        // The central 99 % of the pixels on screen, written to 7 significant digits.
        var lo = percentiles.GetProperty("0.5").GetDouble();
        var hi = percentiles.GetProperty("99.5").GetDouble();
        Assert.Equal("value", url["limits"]);
        Assert.Equal(lo, double.Parse(url["lo"], CultureInfo.InvariantCulture), Math.Abs(lo) * 1e-6);
        Assert.Equal(hi, double.Parse(url["hi"], CultureInfo.InvariantCulture), Math.Abs(hi) * 1e-6);
        Assert.All(tiles, t => Assert.Equal(url["hi"], QueryString.Parse(t.Src)["hi"]));
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task The_limit_handles_work_from_the_keyboard_and_the_panel_folds_away_to_widen_the_image()
    {
        await using var viewer = await site.OpenViewerAsync();
        await viewer.WaitForTilesAsync();
        await viewer.Page.WaitForSelectorAsync($"{Histogram}[data-ready] [data-role=lo-handle]:not([hidden])");
        var (rangeLo, rangeHi) = await HistogramRangeAsync(viewer);
        var lo = double.Parse(await viewer.Page.GetAttributeAsync("[data-role=lo-handle]", "aria-valuenow") ?? "", CultureInfo.InvariantCulture);

        // The handle is a labelled slider (WAI-ARIA slider role); Right Arrow moves it up by a hundredth of the range.
        Assert.Equal("Low limit", await viewer.Page.GetAttributeAsync("[data-role=lo-handle]", "aria-label"));
        await viewer.Page.FocusAsync("[data-role=lo-handle]");
        await viewer.Page.Keyboard.PressAsync("ArrowRight");
        await viewer.Page.WaitForFunctionAsync("() => new URLSearchParams(location.search).get('limits') === 'value'");
        var url = QueryString.Parse(viewer.Page.Url);
        var step = (rangeHi - rangeLo) / 100;
        Assert.Equal(lo + step, double.Parse(url["lo"], CultureInfo.InvariantCulture), Math.Abs(lo + step) * 1e-6);

        var narrow = await viewer.MapBoxAsync();
        Assert.Equal("true", await viewer.Page.GetAttributeAsync("#display-panel-toggle", "aria-expanded"));
        await viewer.Page.FocusAsync("#display-panel-toggle");
        await viewer.Page.Keyboard.PressAsync("Enter");
        Assert.Equal("false", await viewer.Page.GetAttributeAsync("#display-panel-toggle", "aria-expanded"));
        Assert.False(await viewer.Page.IsVisibleAsync("#stretch-picker"), "the folded panel still shows its controls");
        var wide = await viewer.MapBoxAsync();
        Assert.True(wide.Width > narrow.Width + 200, $"the image view is {narrow.Width} px wide with the panel and {wide.Width} px without");
        await viewer.SaveScreenshotAsync("display-panel-folded");
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task A_link_with_unusable_display_settings_draws_with_the_usable_ones_and_says_what_it_left_out()
    {
        // Display contract: a is the log curve's parameter (unused by power); value limits need lo < hi.
        await using var viewer = await site.OpenViewerAsync(
            $"?field={MosaicSite.DemoFieldId}&stretch=power&gamma=3.000&a=5&limits=value&lo=10&hi=5&palette=gray-inv");
        var tiles = await viewer.WaitForTilesAsync("stretch=power");
        Assert.All(tiles, t =>
        {
            var query = QueryString.Parse(t.Src);
            Assert.Equal(("power", "3", "gray-inv"), (query["stretch"], query["gamma"], query["palette"]));
            Assert.False(query.ContainsKey("a") || query.ContainsKey("lo") || query.ContainsKey("hi") || query.ContainsKey("limits"), t.Src);
        });
        var message = await viewer.Page.TextContentAsync("#message") ?? "";
        Assert.True(await viewer.Page.IsVisibleAsync("#message"), "no message about the settings left out");
        Assert.Contains("limits, lo, hi, a.", message);
        // What was kept is valid for the server: no tile request failed.
        Assert.Empty(viewer.FailedTileRequests);
        Assert.True(await viewer.Page.IsCheckedAsync("input[name=limit-mode][value=auto]"));
    }

    [Fact]
    public async Task Cubehelix_parameters_show_only_with_cubehelix_reach_the_tiles_and_retint_its_preview()
    {
        var band = site.Demo.DefaultBand;
        await using var viewer = await site.OpenViewerAsync();
        await viewer.WaitForTilesAsync();
        Assert.False(await viewer.Page.IsVisibleAsync("input[data-param=ch-rot]"), "cubehelix parameters shown with the gray palette");

        await viewer.Page.CheckAsync("input[name=palette][value=cubehelix]");
        await viewer.WaitForTilesAsync("palette=cubehelix");
        Assert.True(await viewer.Page.IsVisibleAsync("input[data-param=ch-rot]"));
        await viewer.Page.FillAsync("input[data-param=ch-rot]", "0.5");
        await viewer.Page.PressAsync("input[data-param=ch-rot]", "Enter");
        await viewer.WaitForTilesAsync("ch-rot=0.5");
        Assert.Equal("0.5", QueryString.Parse(viewer.Page.Url)["ch-rot"]);

        // The preview of cubehelix now shows the colours /display resolves for these parameters, one per column.
        var resolved = await site.GetJsonAsync($"api/fields/{MosaicSite.DemoFieldId}/display?band={band}&palette=cubehelix&ch-rot=0.5");
        var expected = resolved.GetProperty("colorbar").GetProperty("colors").EnumerateArray().Select(c => c.GetString()!).ToArray();
        await viewer.Page.WaitForFunctionAsync("key => document.querySelector('[data-role=colour-bar]').dataset.key === key",
            resolved.GetProperty("key").GetString());
        var shown = await viewer.Page.EvalOnSelectorAsync<string[]>(
            "input[name=palette][value=cubehelix] ~ canvas",
            @"c => { const d = c.getContext('2d').getImageData(0, 0, 256, 1).data; const out = [];
                     for (let i = 0; i < 256; i++) out.push([0, 1, 2].map(k => d[4 * i + k].toString(16).padStart(2, '0')).join(''));
                     return out; }");
        Assert.Equal(expected, shown);
        Assert.Empty(viewer.PageErrors);
    }

    private static double CentreAwayFromEdges(double centre, double halfSpan)
    {
        // Distance of a coordinate from the nearest pixel edge (k + 0.5); best of a few quarter-pixel shifts.
        static double FromEdge(double v) => Math.Abs(v - Math.Floor(v) - 0.5);
        return Enumerable.Range(0, 10).Select(k => Math.Round(centre) + k * 0.1)
            .MaxBy(c => Math.Min(FromEdge(c - halfSpan), FromEdge(c + halfSpan)));
    }

    private static async Task<(double Lo, double Hi)> HistogramRangeAsync(ViewerPage viewer)
    {
        var range = await viewer.Page.EvalOnSelectorAsync<string[]>(Histogram, "h => [h.dataset.lo, h.dataset.hi]");
        return (double.Parse(range[0], CultureInfo.InvariantCulture), double.Parse(range[1], CultureInfo.InvariantCulture));
    }

    /// <summary>Where a value falls on a colour bar whose colour i (of n) shows values[i]: t = i / (n - 1), linear between.</summary>
    private static double PositionOf(double[] values, double value)
    {
        if (value <= values[0]) return 0;
        if (value >= values[^1]) return 1;
        var i = 0;
        while (values[i + 1] <= value) i++;
        var span = values[i + 1] - values[i];
        return (i + (span > 0 ? (value - values[i]) / span : 0)) / (values.Length - 1);
    }

    private static int Step(Rgb24 a, Rgb24 b) => Math.Max(Math.Abs(a.R - b.R), Math.Max(Math.Abs(a.G - b.G), Math.Abs(a.B - b.B)));

    private static IEnumerable<Rgb24> Colours(JsonElement palette) =>
        palette.GetProperty("colors").EnumerateArray().Select(c => Hex(c.GetString()!));

    private static Rgb24 Hex(string rrggbb) => new(
        byte.Parse(rrggbb.AsSpan(0, 2), NumberStyles.HexNumber, CultureInfo.InvariantCulture),
        byte.Parse(rrggbb.AsSpan(2, 2), NumberStyles.HexNumber, CultureInfo.InvariantCulture),
        byte.Parse(rrggbb.AsSpan(4, 2), NumberStyles.HexNumber, CultureInfo.InvariantCulture));

    private static List<Rgba32> OpaquePixels(Image<Rgba32> image)
    {
        var pixels = new List<Rgba32>();
        image.ProcessPixelRows(rows =>
        {
            for (var y = 0; y < rows.Height; y++)
                foreach (var p in rows.GetRowSpan(y))
                    if (p.A == 255) pixels.Add(p);
        });
        return pixels;
    }

    private static int DifferingPixels(Image<Rgba32> a, Image<Rgba32> b)
    {
        var count = 0;
        for (var y = 0; y < a.Height; y++)
            for (var x = 0; x < a.Width; x++)
                if (a[x, y] != b[x, y]) count++;
        return count;
    }

    private static List<string> Sorted(IEnumerable<TileImage> tiles) =>
        [.. tiles.Select(t => QueryString.PathAndQuery(t.Src)).Order(StringComparer.Ordinal)];

    private static void AssertClose(Rgba32 expected, Rgba32 actual) =>
        Assert.True(Math.Abs(expected.R - actual.R) + Math.Abs(expected.G - actual.G) + Math.Abs(expected.B - actual.B) <= 6,
            $"expected {expected} on screen, found {actual}");
}
