using System.Globalization;
using System.Text.Json;
using Microsoft.Playwright;

namespace Mosaic.Browser.Tests.Viewer;

/// <summary>The viewer's sky tools read and driven through the DOM: readout, go-to box, grid, compass, scale bar.</summary>
public static class SkyViewer
{
    private const string SkySelector = "#pixel-readout [data-role=sky]";

    /// <summary>The sky readout once the probe answer for the pixel shown has arrived (call after ReadoutAsync).</summary>
    public static async Task<SkyReadout> SkyReadoutAsync(this ViewerPage viewer)
    {
        await viewer.Page.WaitForFunctionAsync(
            $"() => {{ const k = document.querySelector('{SkySelector}').dataset.kind; return k && k !== 'pending' && k !== 'none'; }}",
            null, new PageWaitForFunctionOptions { Timeout = 10_000, PollingInterval = 20 });
        var parts = await viewer.Page.EvalOnSelectorAsync<string[]>(SkySelector,
            @"s => { const q = r => s.querySelector(`[data-role=${r}]`).textContent;
                     return [s.dataset.kind, q('ra'), q('ra-deg'), q('dec'), q('dec-deg'), q('l'), q('b'),
                             s.dataset.atX ?? '', s.dataset.atY ?? '', s.querySelector('[data-role=no-wcs]').title]; }");
        static double? Number(string text) => text.Length == 0 ? null : double.Parse(text, CultureInfo.InvariantCulture);
        return new SkyReadout(parts[0], parts[1], parts[2], parts[3], parts[4], parts[5], parts[6], Number(parts[7]), Number(parts[8]), parts[9]);
    }

    /// <summary>
    /// The sky readout once it reports a point within <paramref name="tolerance"/> image pixels of FITS position
    /// (<paramref name="x"/>, <paramref name="y"/>): the pointer moved within a pixel re-probes, answering a little later.
    /// </summary>
    public static async Task<SkyReadout> SkyReadoutNearAsync(this ViewerPage viewer, double x, double y, double tolerance)
    {
        var deadline = DateTime.UtcNow + TimeSpan.FromSeconds(10);
        while (true)
        {
            var sky = await viewer.SkyReadoutAsync();
            if (sky.AtX is { } atX && sky.AtY is { } atY && Math.Abs(atX - x) <= tolerance && Math.Abs(atY - y) <= tolerance) return sky;
            if (DateTime.UtcNow > deadline)
                throw new TimeoutException($"the sky readout reports ({sky.AtX}, {sky.AtY}), not a point near ({x}, {y})");
            await Task.Delay(50);
        }
    }

    /// <summary>Types <paramref name="text"/> into the go-to box and presses Enter.</summary>
    public static async Task GoToAsync(this ViewerPage viewer, string text)
    {
        await viewer.Page.FillAsync("#goto-input", text);
        await viewer.Page.PressAsync("#goto-input", "Enter");
    }

    /// <summary>The go-to mark's centre on screen, or null while there is none.</summary>
    public static async Task<ScreenPoint?> MarkerCentreAsync(this ViewerPage viewer)
    {
        var marker = viewer.Page.Locator("#image-view .goto-marker");
        if (await marker.CountAsync() == 0) return null;
        return await CentreAsync(viewer, marker.First);
    }

    /// <summary>Waits for the message line to show a text and returns it.</summary>
    public static async Task<string> MessageAsync(this ViewerPage viewer)
    {
        await viewer.Page.WaitForFunctionAsync("() => { const m = document.querySelector('#message'); return !m.hidden && m.textContent.length > 0; }",
            null, new PageWaitForFunctionOptions { Timeout = 10_000 });
        return await viewer.Page.TextContentAsync("#message") ?? "";
    }

    /// <summary>Waits until the grid shows at least one line of each axis and one label.</summary>
    public static async Task WaitForGridAsync(this ViewerPage viewer) =>
        await viewer.Page.WaitForFunctionAsync(
            "() => document.querySelector('#image-view path.sky-grid-ra') && document.querySelector('#image-view path.sky-grid-dec') && document.querySelector('#image-view .sky-grid-label')",
            null, new PageWaitForFunctionOptions { Timeout = 15_000, PollingInterval = 50 });

    /// <summary>Every drawn grid line with <paramref name="samples"/> points along its path, on screen.</summary>
    public static async Task<IReadOnlyList<GridLine>> GridLinesAsync(this ViewerPage viewer, int samples)
    {
        var json = await viewer.Page.EvaluateAsync<string>(
            @"samples => {
                const view = document.querySelector('#image-view').getBoundingClientRect();
                const lines = [...document.querySelectorAll('#image-view path.sky-grid-line')].map(path => {
                  const length = path.getTotalLength();
                  const matrix = path.getScreenCTM();
                  const points = [];
                  for (let i = 0; i < samples; i++) {
                    const p = path.getPointAtLength(length * (i + 0.5) / samples).matrixTransform(matrix);
                    points.push({ x: p.x - view.left, y: p.y - view.top });
                  }
                  return { axis: path.dataset.axis, value: Number(path.dataset.value), points };
                });
                return JSON.stringify(lines);
              }", samples);
        using var document = JsonDocument.Parse(json);
        return [.. document.RootElement.EnumerateArray().Select(line => new GridLine(
            line.GetProperty("axis").GetString()!,
            line.GetProperty("value").GetDouble(),
            [.. line.GetProperty("points").EnumerateArray().Select(p => new ScreenPoint(p.GetProperty("x").GetDouble(), p.GetProperty("y").GetDouble()))]))];
    }

    public static async Task<IReadOnlyList<GridLabel>> GridLabelsAsync(this ViewerPage viewer)
    {
        var json = await viewer.Page.EvaluateAsync<string>(
            @"() => {
                const view = document.querySelector('#image-view').getBoundingClientRect();
                return JSON.stringify([...document.querySelectorAll('#image-view .sky-grid-label:not([hidden])')].map(label => {
                  const box = label.getBoundingClientRect();
                  return { axis: label.dataset.axis, value: Number(label.dataset.value), text: label.textContent,
                           x: box.left + box.width / 2 - view.left, y: box.top + box.height / 2 - view.top };
                }));
              }");
        using var document = JsonDocument.Parse(json);
        return [.. document.RootElement.EnumerateArray().Select(label => new GridLabel(
            label.GetProperty("axis").GetString()!,
            label.GetProperty("value").GetDouble(),
            label.GetProperty("text").GetString()!,
            new ScreenPoint(label.GetProperty("x").GetDouble(), label.GetProperty("y").GetDouble())))];
    }

    public static async Task<int> GridLineCountAsync(this ViewerPage viewer) =>
        await viewer.Page.Locator("#image-view path.sky-grid-line").CountAsync();

    /// <summary>The centre of an element's box on screen, relative to the image view.</summary>
    public static async Task<ScreenPoint> CentreAsync(this ViewerPage viewer, ILocator element)
    {
        var view = await viewer.MapBoxAsync();
        var box = await element.BoundingBoxAsync() ?? throw new InvalidOperationException("the element is not displayed");
        return new ScreenPoint(box.X + box.Width / 2 - view.X, box.Y + box.Height / 2 - view.Y);
    }
}
