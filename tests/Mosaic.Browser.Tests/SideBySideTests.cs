using System.Globalization;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Reference;
using Mosaic.Browser.Tests.Viewer;

namespace Mosaic.Browser.Tests;

/// <summary>
/// The three channel bands side by side (colour contract, client): one chip in three synchronised maps, each with
/// its own palette; a pan in one moves all, and the readout reads the pixel pointed at in every band (values
/// checked against astropy.io.fits, Debian python3-astropy).
/// </summary>
[Collection(BrowserCollection.Name)]
public sealed class SideBySideTests(MosaicSite site)
{
    private static readonly string[] Channels = ["red", "green", "blue"];

    [Fact]
    public async Task The_panes_follow_a_pan_in_any_of_them_and_read_the_same_pixel_in_every_band()
    {
        var hdu = site.Demo.DefaultHdu;
        await using var viewer = await site.OpenViewerAsync($"?field={MosaicSite.DemoFieldId}&hdu={hdu}");
        await viewer.WaitForTilesAsync();
        await viewer.Page.CheckAsync("input[name=layout-view][value=panes]");
        Assert.Equal("panes", QueryString.Parse(viewer.Page.Url)["view"]);

        // The demo's bands are named after colours, so each goes to its own channel (client README).
        var bands = new Dictionary<string, string>();
        foreach (var channel in Channels)
        {
            bands[channel] = await viewer.Page.InnerTextAsync($".pane[data-pane={channel}] [data-role=pane-band]");
            var tiles = await ColourScreen.WaitForTilesAsync(viewer.Page, PaneTiles(channel), $"band={bands[channel]}");
            Assert.All(tiles, src => Assert.Contains($"hdu={hdu}", src));
        }
        Assert.Equal(["red", "green", "blue"], Channels.Select(c => bands[c]));

        // Zoom in with the middle pane's button, then drag it: the other two follow.
        var start = viewer.Url;
        await viewer.Page.ClickAsync($".pane[data-pane=green] .leaflet-control-zoom-in");
        var zoomed = await viewer.WaitForUrlChangeAsync(start);
        var box = await ColourScreen.BoxAsync(viewer.Page, ColourScreen.Pane("green"));
        var (mx, my) = (box.X + box.Width / 2, box.Y + box.Height / 2);
        await viewer.Page.Mouse.MoveAsync((float)mx, (float)my);
        await viewer.Page.Mouse.DownAsync();
        await viewer.Page.Mouse.MoveAsync((float)(mx - 40), (float)(my + 20), new() { Steps = 4 });
        await viewer.Page.Mouse.MoveAsync((float)(mx - 70), (float)(my + 35), new() { Steps = 4 });
        await viewer.Page.WaitForTimeoutAsync(200); // a still pointer at release: no inertia fling
        await viewer.Page.Mouse.UpAsync();
        var dragged = await viewer.WaitForUrlChangeAsync(zoomed);
        Assert.True(dragged.X > zoomed.X, $"x {zoomed.X} -> {dragged.X} after dragging left");
        Assert.True(dragged.Y > zoomed.Y, $"y {zoomed.Y} -> {dragged.Y} after dragging down");
        foreach (var channel in Channels) await ColourScreen.WaitForTilesAsync(viewer.Page, PaneTiles(channel));

        // The same tile sits at the same place in every pane (relative to its pane's map).
        var placements = new Dictionary<string, Dictionary<string, (double X, double Y)>>();
        foreach (var channel in Channels) placements[channel] = await TilePlacesAsync(viewer, channel);
        var common = placements["green"].Keys.Where(k => placements["red"].ContainsKey(k) && placements["blue"].ContainsKey(k)).ToList();
        Assert.NotEmpty(common);
        foreach (var tile in common)
        {
            foreach (var channel in new[] { "red", "blue" })
            {
                Assert.InRange(placements[channel][tile].X - placements["green"][tile].X, -1, 1);
                Assert.InRange(placements[channel][tile].Y - placements["green"][tile].Y, -1, 1);
            }
        }

        // Pointing in the blue pane reads that pixel in all three bands.
        var chip = site.Demo.Band(bands["blue"]).Hdu(hdu);
        var mapping = await ColourScreen.MappingAsync(viewer, chip.MaxZoom, ColourScreen.Pane("blue"));
        var (fx, fy) = mapping.ToFits(box.Width / 2 + 30, box.Height / 2 - 20);
        var (px, py) = (ScreenMapping.ContainingPixel(fx), ScreenMapping.ContainingPixel(fy));
        var (cx, cy) = mapping.ToContainer(px, py);
        var blueBox = await ColourScreen.BoxAsync(viewer.Page, ColourScreen.Pane("blue"));
        await viewer.Page.Mouse.MoveAsync((float)(blueBox.X + cx), (float)(blueBox.Y + cy));
        foreach (var channel in Channels)
        {
            var readout = await PaneReadoutAsync(viewer, channel);
            Assert.Equal((px.ToString(CultureInfo.InvariantCulture), py.ToString(CultureInfo.InvariantCulture)), (readout.X, readout.Y));
            var reference = AstropyFits.Pixel(site.BandFile(bands[channel]), hdu, px, py);
            if (reference.Value is null)
            {
                Assert.Equal("masked", readout.Kind);
                continue;
            }
            Assert.NotNull(readout.Value);
            Assert.Equal(reference.Value.Value, readout.Value.Value, Math.Abs(reference.Value.Value) * 1e-6 + 1e-9);
        }
        // The other panes mark the point pointed at, at the same place in their own map.
        foreach (var channel in new[] { "red", "green" })
        {
            var mark = await viewer.Page.EvalOnSelectorAsync<double[]>(ColourScreen.Pane(channel),
                @"pane => { const m = pane.querySelector('.echo-marker'); if (!m || m.hidden) return [];
                            const o = pane.getBoundingClientRect(), r = m.getBoundingClientRect();
                            return [r.left + r.width / 2 - o.left, r.top + r.height / 2 - o.top]; }");
            Assert.True(mark.Length == 2, $"no marker in the {channel} pane");
            Assert.InRange(mark[0] - cx, -1.5, 1.5);
            Assert.InRange(mark[1] - cy, -1.5, 1.5);
        }
        Assert.False(await viewer.Page.IsVisibleAsync($"{ColourScreen.Pane("blue")} .echo-marker"));
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/colour-client-panes.png" });
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task Each_pane_keeps_its_own_palette_in_the_url()
    {
        var palettes = await site.GetJsonAsync("api/palettes");
        var palette = palettes.EnumerateArray().Select(p => p.GetProperty("name").GetString()!).First(n => n != "gray");
        await using var viewer = await site.OpenViewerAsync($"?field={MosaicSite.DemoFieldId}&view=panes");
        foreach (var channel in Channels) await ColourScreen.WaitForTilesAsync(viewer.Page, PaneTiles(channel));

        await viewer.Page.SelectOptionAsync(".pane[data-pane=red] [data-role=pane-palette]", palette);
        var red = await ColourScreen.WaitForTilesAsync(viewer.Page, PaneTiles("red"), $"palette={palette}");
        Assert.NotEmpty(red);
        Assert.Equal($"{palette},gray,gray", QueryString.Parse(viewer.Page.Url)["pane-palettes"]);
        foreach (var channel in new[] { "green", "blue" })
        {
            var tiles = await ColourScreen.WaitForTilesAsync(viewer.Page, PaneTiles(channel));
            Assert.All(tiles, src => Assert.DoesNotContain($"palette={palette}", src));
        }

        await using var restored = await site.OpenViewerAsync(new Uri(viewer.Page.Url).Query);
        await ColourScreen.WaitForTilesAsync(restored.Page, PaneTiles("red"), $"palette={palette}");
        Assert.Equal(palette, await restored.Page.InputValueAsync(".pane[data-pane=red] [data-role=pane-palette]"));
        Assert.Equal("gray", await restored.Page.InputValueAsync(".pane[data-pane=green] [data-role=pane-palette]"));
        Assert.Empty(viewer.PageErrors);
        Assert.Empty(restored.PageErrors);
    }

    private static string PaneTiles(string channel) => $"{ColourScreen.Pane(channel)} .image-tiles img.leaflet-tile";

    private static async Task<Dictionary<string, (double X, double Y)>> TilePlacesAsync(ViewerPage viewer, string channel)
    {
        var places = await viewer.Page.EvalOnSelectorAsync<TilePlace[]>(ColourScreen.Pane(channel),
            @"pane => { const origin = pane.getBoundingClientRect();
                        return [...pane.querySelectorAll('.image-tiles img.leaflet-tile')].map(t => {
                          const r = t.getBoundingClientRect();
                          return { key: new URL(t.src).pathname, x: r.left - origin.left, y: r.top - origin.top };
                        }); }");
        return places.ToDictionary(p => p.Key, p => (p.X, p.Y));
    }

    private static async Task<(string X, string Y, string Kind, double? Value)> PaneReadoutAsync(ViewerPage viewer, string channel)
    {
        var selector = $".pane[data-pane={channel}] .pane-readout";
        await viewer.Page.WaitForFunctionAsync(
            "s => { const k = document.querySelector(s + ' [data-role=value]').dataset.kind; return k && k !== 'pending' && k !== 'none'; }",
            selector, new() { Timeout = 10_000, PollingInterval = 20 });
        var parts = await viewer.Page.EvalOnSelectorAsync<string[]>(selector,
            "r => { const q = s => r.querySelector(`[data-role=${s}]`); const v = q('value'); return [q('x').textContent, q('y').textContent, v.dataset.kind, v.dataset.value ?? '']; }");
        return (parts[0], parts[1], parts[2], parts[3].Length == 0 ? null : double.Parse(parts[3], CultureInfo.InvariantCulture));
    }

    private sealed class TilePlace
    {
        public string Key { get; set; } = "";

        public double X { get; set; }

        public double Y { get; set; }
    }
}
