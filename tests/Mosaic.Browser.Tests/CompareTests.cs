using System.Globalization;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Viewer;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Browser.Tests;

/// <summary>
/// Comparing two layers (colour contract, client): a swipe divider shows the first layer left of it and the second
/// right of it; a blink shows them in turn at an interval that can be set. Here the layers are the colour composite
/// (each source in its own channel: a colour) and one band (gray: r = g = b, display contract's default palette).
/// </summary>
[Collection(BrowserCollection.Name)]
public sealed class CompareTests(MosaicSite site)
{
    private const string Divider = "[data-role=compare-divider]";

    [Fact]
    public async Task The_divider_shows_the_composite_left_of_it_and_the_band_right_of_it_wherever_it_is_dragged()
    {
        var field = await ColourField.EnsureAsync(site);
        await using var viewer = await site.OpenViewerAsync(Query(field, "swipe"));
        await viewer.WaitForTilesAsync("rgb=lupton");
        await ColourScreen.WaitForTilesAsync(viewer.Page, "#image-view .compare-tiles img.leaflet-tile", $"band={ColourField.Long}");

        var mapping = await ColourScreen.MappingAsync(viewer, field.Chip.MaxZoom);
        var box = await viewer.MapBoxAsync();
        var left = field.Sources[ColourField.Middle];   // x = 32
        var right = field.Sources[ColourField.Short];   // x = 96, same y
        var (leftX, _) = mapping.ToContainer(left.X, left.Y);
        var (rightX, _) = mapping.ToContainer(right.X, right.Y);
        Assert.True(leftX + 100 < rightX, $"sources at {leftX} and {rightX} on screen");

        // Between the two sources: the left one in the composite's green, the right one in the long band's gray.
        var between = (leftX + rightX) / 2;
        await DragDividerAsync(viewer, between);
        await viewer.Page.WaitForFunctionAsync("() => new URLSearchParams(location.search).has('divider')");
        var share = double.Parse(QueryString.Parse(viewer.Page.Url)["divider"], CultureInfo.InvariantCulture);
        Assert.InRange(share, between / box.Width - 0.01, between / box.Width + 0.01);
        var leftColour = await ColourScreen.AtPixelAsync(viewer, mapping, left.X, left.Y);
        var rightColour = await ColourScreen.AtPixelAsync(viewer, mapping, right.X, right.Y);
        Assert.True(leftColour.G > leftColour.R + 100 && leftColour.G > leftColour.B + 100, $"left of the divider {leftColour}: not the composite's green");
        Assert.True(IsGray(rightColour), $"right of the divider {rightColour}: not the gray band");
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/colour-client-swipe.png" });

        // Past the right source: both show the composite (the right one in blue).
        await DragDividerAsync(viewer, rightX + 60);
        rightColour = await ColourScreen.AtPixelAsync(viewer, mapping, right.X, right.Y);
        Assert.True(rightColour.B > rightColour.R + 100 && rightColour.B > rightColour.G + 100, $"{rightColour}: not the composite's blue");

        // Before the left source: both show the gray band; its own source (bright there) is white-ish gray.
        await DragDividerAsync(viewer, leftX - 60);
        leftColour = await ColourScreen.AtPixelAsync(viewer, mapping, left.X, left.Y);
        Assert.True(IsGray(leftColour), $"{leftColour}: not the gray band");
        var (longX, longY) = field.Sources[ColourField.Long];
        var longColour = await ColourScreen.AtPixelAsync(viewer, mapping, longX, longY);
        Assert.True(IsGray(longColour) && longColour.R > 150, $"{longColour}: the long band's own source is not bright gray");

        // The divider can be worked from the keyboard: Page Up moves it a tenth of the view to the right.
        var before = double.Parse(QueryString.Parse(viewer.Page.Url)["divider"], CultureInfo.InvariantCulture);
        await viewer.Page.FocusAsync(Divider);
        await viewer.Page.Keyboard.PressAsync("PageUp");
        await viewer.Page.WaitForFunctionAsync("b => Number(new URLSearchParams(location.search).get('divider')) > b", before);
        var after = double.Parse(QueryString.Parse(viewer.Page.Url)["divider"], CultureInfo.InvariantCulture);
        Assert.Equal(before + 0.1, after, 3);
        Assert.Empty(viewer.FailedTileRequests);
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task Blinking_alternates_the_two_layers_at_the_interval_set_in_the_panel()
    {
        var field = await ColourField.EnsureAsync(site);
        await using var viewer = await site.OpenViewerAsync(Query(field, "blink") + "&blink=300");
        await viewer.WaitForTilesAsync("rgb=lupton");
        await ColourScreen.WaitForTilesAsync(viewer.Page, "#image-view .compare-tiles img.leaflet-tile", $"band={ColourField.Long}");
        var mapping = await ColourScreen.MappingAsync(viewer, field.Chip.MaxZoom);
        var (sx, sy) = field.Sources[ColourField.Short];

        // Sampled for about three seconds: the short band's source shows both as the composite's blue and as the
        // long band's gray sky.
        var colours = new List<Rgba32>();
        for (var i = 0; i < 30; i++)
        {
            colours.Add(await ColourScreen.AtPixelAsync(viewer, mapping, sx, sy));
            await viewer.Page.WaitForTimeoutAsync(100);
        }
        Assert.Contains(colours, c => c.B > c.R + 100 && c.B > c.G + 100);
        Assert.Contains(colours, IsGray);
        await viewer.Page.ScreenshotAsync(new() { Path = "/tmp/colour-client-blink.png" });

        var fast = await MedianSwitchIntervalAsync(viewer, TimeSpan.FromSeconds(3));
        Assert.True(fast < 1000, $"switches every {fast} ms with a 300 ms interval");

        await viewer.Page.FillAsync("input[data-param=blink]", "1500");
        await viewer.Page.PressAsync("input[data-param=blink]", "Enter");
        await viewer.Page.WaitForFunctionAsync("() => new URLSearchParams(location.search).get('blink') === '1500'");
        var slow = await MedianSwitchIntervalAsync(viewer, TimeSpan.FromSeconds(6));
        Assert.True(slow >= 1200, $"switches every {slow} ms with a 1500 ms interval");
        Assert.Empty(viewer.PageErrors);
    }

    private static string Query(ColourField field, string view) =>
        $"?field={field.Id}&rgb=lupton&red={ColourField.Long}&green={ColourField.Middle}&blue={ColourField.Short}" +
        $"&view={view}&first=composite&second={ColourField.Long}";

    // The gray palette draws r = g = b (display contract); a screenshot may be off by one in a channel.
    private static bool IsGray(Rgba32 c) => !ColourScreen.IsChromatic(c, tolerance: 2);

    private static async Task DragDividerAsync(ViewerPage viewer, double containerX)
    {
        var map = await viewer.MapBoxAsync();
        var handle = await viewer.Page.Locator($"{Divider} .compare-divider-grip").BoundingBoxAsync()
            ?? throw new InvalidOperationException("no divider");
        var (x, y) = (handle.X + handle.Width / 2, handle.Y + handle.Height / 2);
        await viewer.Page.Mouse.MoveAsync((float)x, (float)y);
        await viewer.Page.Mouse.DownAsync();
        await viewer.Page.Mouse.MoveAsync((float)(map.X + containerX), (float)y, new() { Steps = 6 });
        await viewer.Page.Mouse.UpAsync();
        var target = containerX / map.Width;
        await viewer.Page.WaitForFunctionAsync(
            "t => Math.abs(Number(new URLSearchParams(location.search).get('divider')) - t) < 0.01", target);
    }

    /// <summary>The median time between the layer on show changing, watched in the page for <paramref name="span"/>.</summary>
    private static async Task<double> MedianSwitchIntervalAsync(ViewerPage viewer, TimeSpan span)
    {
        var times = await viewer.Page.EvaluateAsync<double[]>(
            @"ms => new Promise(done => {
                const view = document.getElementById('image-view');
                const seen = [];
                const watch = new MutationObserver(() => seen.push(performance.now()));
                watch.observe(view, { attributes: true, attributeFilter: ['data-showing'] });
                setTimeout(() => { watch.disconnect(); done(seen); }, ms);
              })",
            span.TotalMilliseconds);
        Assert.True(times.Length >= 3, $"the layer on show changed {times.Length} times in {span.TotalSeconds} s");
        var gaps = times.Zip(times.Skip(1), (a, b) => b - a).Order().ToArray();
        return gaps[gaps.Length / 2];
    }
}
