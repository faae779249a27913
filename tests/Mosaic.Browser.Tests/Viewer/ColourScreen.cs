using Microsoft.Playwright;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Browser.Tests.Viewer;

/// <summary>Colours on screen at FITS pixels, in the single image view or in one of the side-by-side panes.</summary>
public static class ColourScreen
{
    public const string SingleView = "#image-view";

    public static string Pane(string channel) => $".pane[data-pane={channel}] .pane-view";

    /// <summary>Where FITS positions appear in <paramref name="container"/>, from the centre and zoom the page URL gives.</summary>
    public static async Task<ScreenMapping> MappingAsync(ViewerPage viewer, int maxZoom, string container = SingleView)
    {
        var box = await BoxAsync(viewer.Page, container);
        var url = viewer.Url;
        if (url is not { X: not null, Y: not null, Z: not null }) throw new InvalidOperationException($"no view in {viewer.Page.Url}");
        return new ScreenMapping(box.Width, box.Height, url.X.Value, url.Y.Value, url.Z.Value, maxZoom);
    }

    /// <summary>The colour drawn at the centre of FITS pixel (x, y) (a 1 x 1 screenshot there).</summary>
    public static async Task<Rgba32> AtPixelAsync(ViewerPage viewer, ScreenMapping mapping, int x, int y, string container = SingleView)
    {
        var (cx, cy) = mapping.ToContainer(x, y);
        return await AtAsync(viewer.Page, container, cx, cy);
    }

    public static async Task<Rgba32> AtAsync(IPage page, string container, double cx, double cy)
    {
        var box = await BoxAsync(page, container);
        var png = await page.ScreenshotAsync(new PageScreenshotOptions
        {
            Clip = new Clip { X = (float)Math.Floor(box.X + cx), Y = (float)Math.Floor(box.Y + cy), Width = 1, Height = 1 },
        });
        using var image = Image.Load<Rgba32>(png);
        return image[0, 0];
    }

    public static async Task<LocatorBoundingBoxResult> BoxAsync(IPage page, string container) =>
        await page.Locator(container).BoundingBoxAsync() ?? throw new InvalidOperationException($"{container} is not displayed");

    /// <summary>
    /// Waits until the map is still and every tile &lt;img&gt; matching <paramref name="tiles"/> has loaded (all with
    /// <paramref name="srcContains"/> in their URL, when given); returns their URLs.
    /// </summary>
    public static async Task<IReadOnlyList<string>> WaitForTilesAsync(IPage page, string tiles, string? srcContains = null)
    {
        await page.WaitForFunctionAsync(
            @"([selector, part]) => {
                if (document.querySelector('.leaflet-zoom-anim, .leaflet-pan-anim')) return false;
                const all = [...document.querySelectorAll(selector)];
                return all.length > 0 && all.every(t => t.complete && t.naturalWidth > 0) && (part === null || all.every(t => t.src.includes(part)));
            }",
            new object?[] { tiles, srcContains },
            new PageWaitForFunctionOptions { Timeout = 30_000, PollingInterval = 100 });
        return await page.EvalOnSelectorAllAsync<string[]>(tiles, "all => all.map(t => t.src)");
    }

    /// <summary>True where the three channels differ by more than <paramref name="tolerance"/>: a colour, not a gray.</summary>
    public static bool IsChromatic(Rgba32 c, int tolerance = 8) =>
        Math.Max(Math.Max(c.R, c.G), c.B) - Math.Min(Math.Min(c.R, c.G), c.B) > tolerance;
}
