using System.Globalization;
using System.Text.Json;
using Microsoft.Playwright;

namespace Mosaic.Browser.Tests.Viewer;

/// <summary>
/// The markers panel of one viewer page, driven through its controls, and the markers as drawn over the image: each
/// drawn marker's centre element carries the FITS position and outline it was drawn at.
/// </summary>
public sealed class MarkerControls(ViewerPage viewer)
{
    private IPage Page => viewer.Page;

    public async Task OpenAsync()
    {
        if (await Page.IsHiddenAsync("#marker-panel")) await Page.ClickAsync("#marker-toggle");
        await Page.WaitForSelectorAsync("#marker-panel", new PageWaitForSelectorOptions { State = WaitForSelectorState.Visible });
    }

    public async Task CloseAsync()
    {
        if (await Page.IsVisibleAsync("#marker-panel")) await Page.ClickAsync("#marker-toggle");
        await Page.WaitForSelectorAsync("#marker-panel", new PageWaitForSelectorOptions { State = WaitForSelectorState.Hidden });
    }

    /// <summary>Sets what the next marker is: kind, sizes (arcsec, or pixels on an image without WCS) and label.</summary>
    public async Task ChooseAsync(string kind, string label, double radius = 5, double width = 10, double height = 10)
    {
        await OpenAsync();
        await Page.CheckAsync($"#marker-panel input[name=marker-kind][value={kind}]");
        // Only the sizes of the chosen kind are shown.
        if (kind == "circle") await Page.FillAsync("#marker-panel [data-role=radius]", Number(radius));
        if (kind == "box")
        {
            await Page.FillAsync("#marker-panel [data-role=width]", Number(width));
            await Page.FillAsync("#marker-panel [data-role=height]", Number(height));
        }
        await Page.FillAsync("#marker-panel [data-role=label]", label);
    }

    /// <summary>Presses (or releases) "Place by clicking".</summary>
    public async Task SetPlacingAsync(bool on)
    {
        await OpenAsync();
        var pressed = await Page.GetAttributeAsync("#marker-panel [data-role=place]", "aria-pressed") == "true";
        if (pressed != on) await Page.ClickAsync("#marker-panel [data-role=place]");
    }

    /// <summary>
    /// Clicks the image near a point relative to the image view and waits for the new marker to be drawn; returns the
    /// point clicked. A mouse event carries whole CSS pixels of the page, so the click is on the nearest one.
    /// </summary>
    public async Task<ScreenPoint> ClickAsync(double containerX, double containerY)
    {
        var before = await CountAsync();
        var box = await viewer.MapBoxAsync();
        var (pageX, pageY) = (Math.Round(box.X + containerX), Math.Round(box.Y + containerY));
        await Page.Mouse.ClickAsync((float)pageX, (float)pageY);
        await WaitForPlacedAsync(before + 1);
        return new ScreenPoint(pageX - box.X, pageY - box.Y);
    }

    /// <summary>The map's own size in whole CSS pixels (clientWidth, clientHeight): its centre is at their middle.</summary>
    public async Task<(int Width, int Height)> MapSizeAsync()
    {
        var size = await Page.EvalOnSelectorAsync<int[]>("#image-view", "e => [e.clientWidth, e.clientHeight]");
        return (size[0], size[1]);
    }

    /// <summary>Types a position into the panel and adds the marker, waiting for it to be drawn (or looked up).</summary>
    public async Task AddTypedAsync(string position)
    {
        var before = await CountAsync();
        await OpenAsync();
        await Page.FillAsync("#marker-panel [data-role=position]", position);
        await Page.ClickAsync("#marker-panel [data-role=add]");
        await WaitForPlacedAsync(before + 1);
    }

    public async Task<int> CountAsync() => await Page.Locator("#marker-panel .marker-row").CountAsync();

    /// <summary>Waits until the page has looked up all <paramref name="count"/> markers on the image shown.</summary>
    public async Task WaitForPlacedAsync(int count) =>
        await Page.WaitForFunctionAsync("n => document.getElementById('image-view').dataset.markersPlaced === String(n)", count,
            new PageWaitForFunctionOptions { Timeout = 15_000, PollingInterval = 20 });

    /// <summary>Every marker drawn on the image, in list order.</summary>
    public async Task<IReadOnlyList<DrawnMarker>> DrawnAsync()
    {
        var view = await viewer.MapBoxAsync();
        var json = await Page.EvalOnSelectorAllAsync<string>("#image-view .mark-anchor",
            @"els => JSON.stringify(els.map(e => { const r = e.getBoundingClientRect();
                return { index: Number(e.dataset.index), x: Number(e.dataset.x), y: Number(e.dataset.y), outline: JSON.parse(e.dataset.outline),
                         cx: r.left + r.width / 2, cy: r.top + r.height / 2 }; }))");
        var drawn = new List<DrawnMarker>();
        foreach (var e in JsonDocument.Parse(json).RootElement.EnumerateArray())
        {
            var outline = e.GetProperty("outline").EnumerateArray().Select(p => (p[0].GetDouble(), p[1].GetDouble())).ToList();
            drawn.Add(new DrawnMarker(e.GetProperty("index").GetInt32(), e.GetProperty("x").GetDouble(), e.GetProperty("y").GetDouble(), outline,
                new ScreenPoint(e.GetProperty("cx").GetDouble() - view.X, e.GetProperty("cy").GetDouble() - view.Y)));
        }
        return [.. drawn.OrderBy(d => d.Index)];
    }

    /// <summary>The screen box (relative to the image view) of the outline drawn for the n-th circle or box on screen.</summary>
    public async Task<LocatorBoundingBoxResult> ShapeBoxAsync(int nth)
    {
        var view = await viewer.MapBoxAsync();
        var box = await Page.Locator("#image-view path.mark-shape").Nth(nth).BoundingBoxAsync()
            ?? throw new InvalidOperationException("the marker's outline is not displayed");
        return new LocatorBoundingBoxResult { X = box.X - view.X, Y = box.Y - view.Y, Width = box.Width, Height = box.Height };
    }

    /// <summary>Clicks a download button of the panel ("csv" or "json") and returns the file's text and suggested name.</summary>
    public async Task<(string Name, string Text)> DownloadAsync(string format)
    {
        await OpenAsync();
        var download = await Page.RunAndWaitForDownloadAsync(() => Page.ClickAsync($"#marker-panel [data-role={format}]"));
        var path = await download.PathAsync();
        return (download.SuggestedFilename, await File.ReadAllTextAsync(path));
    }

    private static string Number(double value) => value.ToString("R", CultureInfo.InvariantCulture);
}
