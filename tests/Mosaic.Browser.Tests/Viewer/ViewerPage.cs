using System.Collections.Concurrent;
using System.Globalization;
using Microsoft.Playwright;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Browser.Tests.Viewer;

/// <summary>
/// The viewer page in its own browser context, read and driven the way a person would: through the DOM, the
/// mouse, the keyboard and what is drawn on screen. Failed tile requests are recorded from the first request on.
/// </summary>
public sealed class ViewerPage : IAsyncDisposable
{
    private const string TileSelector = "#image-view .image-tiles img.leaflet-tile";
    private readonly ConcurrentQueue<string> _failedTiles = new();
    private readonly ConcurrentQueue<string> _pageErrors = new();
    private readonly Lock _centreLock = new();
    // The centre of the newest URL that named it by pixel, with the field, band and HDU it was on.
    private (string? Field, string? Band, int? Hdu, bool WholeField, double X, double Y)? _pixelCentre;

    private ViewerPage(IBrowserContext context, IPage page)
    {
        Context = context;
        Page = page;
        page.Response += (_, response) =>
        {
            if (IsTile(response.Url) && response.Status >= 400) _failedTiles.Enqueue($"{response.Status} {response.Url}");
        };
        page.RequestFailed += (_, request) =>
        {
            if (IsTile(request.Url)) _failedTiles.Enqueue($"failed ({request.Failure}) {request.Url}");
        };
        page.PageError += (_, error) => _pageErrors.Enqueue(error);
        page.FrameNavigated += (_, frame) =>
        {
            if (frame == page.MainFrame) RememberPixelCentre(frame.Url);
        };
        page.Console += (_, message) =>
        {
            // The location names the resource where loading one failed; the text alone does not.
            if (message.Type == "error") _pageErrors.Enqueue($"{message.Text} ({message.Location})");
        };
    }

    public IBrowserContext Context { get; }

    public IPage Page { get; }

    public IReadOnlyCollection<string> FailedTileRequests => _failedTiles.ToArray();

    /// <summary>Uncaught script errors and console errors.</summary>
    public IReadOnlyCollection<string> PageErrors => _pageErrors.ToArray();

    public static async Task<ViewerPage> OpenAsync(IBrowserContext context, string query)
    {
        var page = await context.NewPageAsync();
        var viewer = new ViewerPage(context, page);
        await page.GotoAsync("/" + query);
        // The chip picker fills once the field list has arrived and a field is open.
        await page.WaitForFunctionAsync("() => document.querySelector('#hdu-picker').options.length > 0");
        return viewer;
    }

    /// <summary>
    /// The view the page's URL shows, its centre in FITS pixels. A version 1 URL names the centre by RA/Dec once the
    /// server has converted it; the page writes the exact pixel centre first, so the centre of such a URL is that of
    /// the newest URL that named it by pixel on the same field, band and HDU.
    /// </summary>
    public ViewQuery Url => WithPixelCentre(Page.Url);

    /// <summary>Whether the page's URL names its centre by RA/Dec (link version 1 on an HDU with a celestial WCS).</summary>
    public bool UrlCentreOnSky => IsSkyForm(Page.Url);

    /// <summary>Waits until the URL names its centre by RA/Dec, and returns the URL.</summary>
    public async Task<string> WaitForSkyUrlAsync()
    {
        await Page.WaitForFunctionAsync("() => { const q = new URLSearchParams(location.search); return q.has('ra') && q.has('dec'); }",
            null, new PageWaitForFunctionOptions { Timeout = 10_000, PollingInterval = 20 });
        return Page.Url;
    }

    private static bool IsSkyForm(string url)
    {
        var query = QueryString.Parse(url);
        return query.ContainsKey("ra") && query.ContainsKey("dec") && !query.ContainsKey("x");
    }

    private void RememberPixelCentre(string url)
    {
        var view = ViewQuery.FromUrl(url);
        if (view is not { X: { } x, Y: { } y }) return;
        lock (_centreLock) _pixelCentre = (view.Field, view.Band, view.Hdu, view.WholeField, x, y);
    }

    private ViewQuery WithPixelCentre(string url)
    {
        var view = ViewQuery.FromUrl(url);
        if (!IsSkyForm(url)) return view;
        lock (_centreLock)
        {
            return _pixelCentre is { } known && (known.Field, known.Band, known.Hdu, known.WholeField) == (view.Field, view.Band, view.Hdu, view.WholeField)
                ? view with { X = known.X, Y = known.Y }
                : view;
        }
    }

    /// <summary>Waits until the map is still and every tile of the image layer has finished loading (or failing) and fading in.</summary>
    public async Task<IReadOnlyList<TileImage>> WaitForTilesAsync(string? srcContains = null)
    {
        await Page.WaitForFunctionAsync(
            @"([selector, part]) => {
                if (document.querySelector('.leaflet-zoom-anim, .leaflet-pan-anim')) return false;
                const tiles = [...document.querySelectorAll(selector)];
                // Complete, and done fading in: colours read off the screen are then the tiles' own.
                const settled = t => t.complete && (t.style.opacity === '' || t.style.opacity === '1');
                return tiles.length > 0 && tiles.every(settled) && (part === null || tiles.every(t => t.src.includes(part)));
            }",
            new object?[] { TileSelector, srcContains },
            new PageWaitForFunctionOptions { Timeout = 30_000, PollingInterval = 100 });
        return await TilesAsync();
    }

    public async Task<IReadOnlyList<TileImage>> TilesAsync()
    {
        var tiles = await Page.EvalOnSelectorAllAsync<TileImage[]>(TileSelector,
            "tiles => tiles.map(t => ({ src: t.src, naturalWidth: t.naturalWidth, naturalHeight: t.naturalHeight, loaded: t.classList.contains('leaflet-tile-loaded') }))");
        return tiles;
    }

    /// <summary>Waits for the URL to show a view other than <paramref name="before"/>, with the map at rest.</summary>
    public async Task<ViewQuery> WaitForUrlChangeAsync(ViewQuery before)
    {
        var deadline = DateTime.UtcNow + TimeSpan.FromSeconds(15);
        while (true)
        {
            var href = await Page.EvaluateAsync<string>("() => document.querySelector('.leaflet-zoom-anim, .leaflet-pan-anim') ? '' : location.href");
            if (href.Length > 0 && WithPixelCentre(href) is var now && now != before) return now;
            if (DateTime.UtcNow > deadline) throw new TimeoutException($"the URL still shows {before} after 15 s");
            await Task.Delay(50);
        }
    }

    /// <summary>The image view's size in CSS pixels and where its top-left corner is on the page.</summary>
    public async Task<LocatorBoundingBoxResult> MapBoxAsync() =>
        await Page.Locator("#image-view").BoundingBoxAsync() ?? throw new InvalidOperationException("the image view is not displayed");

    /// <summary>Moves the mouse to a point given relative to the image view's top-left corner.</summary>
    public async Task PointAtAsync(double containerX, double containerY)
    {
        var box = await MapBoxAsync();
        await Page.Mouse.MoveAsync((float)(box.X + containerX), (float)(box.Y + containerY));
    }

    /// <summary>The readout once it has settled on a value (or on masked / outside / an error) for the pixel shown.</summary>
    public async Task<Readout> ReadoutAsync()
    {
        await Page.WaitForFunctionAsync("() => { const k = document.querySelector('#pixel-readout [data-role=value]').dataset.kind; return k && k !== 'pending' && k !== 'none'; }",
            null, new PageWaitForFunctionOptions { Timeout = 10_000, PollingInterval = 20 });
        var parts = await Page.EvalOnSelectorAsync<string[]>("#pixel-readout",
            @"r => { const q = s => r.querySelector(`[data-role=${s}]`);
                     const v = q('value');
                     return [q('hdu').textContent, q('x').textContent, q('y').textContent, v.textContent, v.dataset.kind, v.dataset.value ?? ''];
                   }");
        double? raw = parts[5].Length == 0 ? null : double.Parse(parts[5], CultureInfo.InvariantCulture);
        return new Readout(parts[0], parts[1], parts[2], parts[3], parts[4], raw);
    }

    /// <summary>The colour drawn on screen at a point of the image view (a 1 x 1 screenshot).</summary>
    public async Task<Rgba32> ScreenColourAsync(double containerX, double containerY)
    {
        var box = await MapBoxAsync();
        var png = await Page.ScreenshotAsync(new PageScreenshotOptions
        {
            Clip = new Clip { X = (float)Math.Floor(box.X + containerX), Y = (float)Math.Floor(box.Y + containerY), Width = 1, Height = 1 },
        });
        using var image = Image.Load<Rgba32>(png);
        return image[0, 0];
    }

    /// <summary>A CSS colour custom property of the page (e.g. --mask-colour) as RGBA, as the browser resolves it.</summary>
    public async Task<Rgba32> CssColourAsync(string property)
    {
        var rgb = await Page.EvaluateAsync<int[]>(
            @"name => { const probe = document.createElement('div');
                        probe.style.color = `var(${name})`; document.body.append(probe);
                        const m = getComputedStyle(probe).color.match(/[\d.]+/g).map(Number); probe.remove(); return m.slice(0, 3); }",
            property);
        return new Rgba32((byte)rgb[0], (byte)rgb[1], (byte)rgb[2], 255);
    }

    public async Task SaveScreenshotAsync(string name)
    {
        var folder = Path.Combine(AppContext.BaseDirectory, "screenshots");
        Directory.CreateDirectory(folder);
        await Page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.Combine(folder, name + ".png") });
    }

    public async ValueTask DisposeAsync() => await Context.CloseAsync();

    private static bool IsTile(string url) => new Uri(url).AbsolutePath.StartsWith("/tiles/", StringComparison.Ordinal);
}
