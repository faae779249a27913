using System.Globalization;
using System.Text.Json;

namespace Mosaic.Browser.Tests.Viewer;

/// <summary>The viewer's whole-field tools read and driven through the DOM: chip outlines, their toggle, the chip under the pointer.</summary>
public static class WholeFieldViewer
{
    /// <summary>
    /// The exact position on the original chip of the point the readout reports (the probe's atX/atY, kept on
    /// the chip label), or nulls in a gap. Call after ReadoutAsync.
    /// </summary>
    public static async Task<(double? X, double? Y)> ChipPositionAsync(this ViewerPage viewer)
    {
        var parts = await viewer.Page.EvalOnSelectorAsync<string[]>("#pixel-readout [data-role=hdu]",
            "l => [l.dataset.atX ?? '', l.dataset.atY ?? '']");
        static double? Number(string text) => text.Length == 0 ? null : double.Parse(text, CultureInfo.InvariantCulture);
        return (Number(parts[0]), Number(parts[1]));
    }

    /// <summary>The canvas pixel the readout shows beside the chip's ("field x, y").</summary>
    public static async Task<(string X, string Y)> CanvasPixelAsync(this ViewerPage viewer)
    {
        var parts = await viewer.Page.EvalOnSelectorAsync<string[]>("#pixel-readout",
            "r => [r.querySelector('[data-role=canvas-x]').textContent, r.querySelector('[data-role=canvas-y]').textContent]");
        return (parts[0], parts[1]);
    }

    /// <summary>The readout's HDU label as it stands: the name of what is viewed, of the chip under the pointer, or "gap".</summary>
    public static async Task<string> ReadoutHduAsync(this ViewerPage viewer) =>
        await viewer.Page.TextContentAsync("#pixel-readout [data-role=hdu]") ?? "";

    public static async Task<IReadOnlyList<DrawnOutline>> OutlinesAsync(this ViewerPage viewer)
    {
        var json = await viewer.Page.EvaluateAsync<string>(
            @"() => {
                const view = document.querySelector('#image-view').getBoundingClientRect();
                return JSON.stringify([...document.querySelectorAll('#image-view path.chip-outline')].map(path => {
                  const box = path.getBoundingClientRect();
                  return { hdu: Number(path.dataset.hdu), name: path.dataset.name ?? '',
                           left: box.left - view.left, top: box.top - view.top, right: box.right - view.left, bottom: box.bottom - view.top };
                }));
              }");
        using var document = JsonDocument.Parse(json);
        return [.. document.RootElement.EnumerateArray().Select(o => new DrawnOutline(
            o.GetProperty("hdu").GetInt32(), o.GetProperty("name").GetString()!,
            o.GetProperty("left").GetDouble(), o.GetProperty("top").GetDouble(),
            o.GetProperty("right").GetDouble(), o.GetProperty("bottom").GetDouble()))];
    }

    /// <summary>The texts of the chip name labels on the map.</summary>
    public static async Task<IReadOnlyList<string>> OutlineLabelsAsync(this ViewerPage viewer) =>
        await viewer.Page.EvalOnSelectorAllAsync<string[]>("#image-view .chip-outline-label", "ls => ls.map(l => l.textContent)");

    public static async Task<bool> OutlinesPressedAsync(this ViewerPage viewer) =>
        await viewer.Page.GetAttributeAsync("#outline-toggle", "aria-pressed") == "true";

    /// <summary>Waits until <paramref name="count"/> chip outlines are drawn.</summary>
    public static async Task WaitForOutlinesAsync(this ViewerPage viewer, int count) =>
        await viewer.Page.WaitForFunctionAsync("n => document.querySelectorAll('#image-view path.chip-outline').length === n", count,
            new() { Timeout = 10_000, PollingInterval = 50 });
}
