using System.Collections.Concurrent;
using System.Text.RegularExpressions;
using Microsoft.Playwright;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Viewer;

namespace Mosaic.Browser.Tests;

/// <summary>
/// What the page does to show its first screen sooner must not change what it shows: every module it runs was asked
/// for by the page itself at the start (none found late, one import level at a time), a link's tiles are asked for
/// once each and only for the view the link names, the view is the link's, and the page still opens when the field
/// list asked for early is lost.
/// </summary>
[Collection(BrowserCollection.Name)]
public sealed partial class FirstScreenTests(MosaicSite site)
{
    private static readonly string[] EntryModules = ["boot.js", "app.js"];

    [Fact]
    public async Task Every_module_the_page_runs_is_asked_for_by_the_page_itself_not_found_later_by_an_import()
    {
        await using var viewer = await site.OpenViewerAsync();
        await viewer.WaitForTilesAsync();
        // W3C Resource Timing: when each script's fetch started and its response ended, on the page's clock. A module
        // found through an import can only be asked for once a module importing it has arrived, so each must be
        // asked for before the first of its importers arrives. (Not before the first module of all arrives: under
        // load the parser may reach the last preload link after some response is in, which is no late discovery.)
        var scripts = await viewer.Page.EvaluateAsync<ScriptTiming[]>("""
            () => performance.getEntriesByType('resource')
              .filter(e => new URL(e.name).pathname.endsWith('.js'))
              .map(e => ({ path: new URL(e.name).pathname.slice(1), start: e.startTime, end: e.responseEnd }))
            """);
        var preloads = await viewer.Page.EvaluateAsync<string[]>(
            "() => [...document.querySelectorAll('link[rel=modulepreload]')].map(l => l.getAttribute('href'))");
        var importMap = await viewer.Page.EvaluateAsync<Dictionary<string, string>>(
            "() => JSON.parse(document.querySelector('script[type=importmap]').textContent).imports");
        Assert.True(scripts.Length > 40, $"only {scripts.Length} scripts loaded");
        Assert.Contains(scripts, s => s.Path == "lib/leaflet/leaflet-src.esm.js");
        Assert.Equal(scripts.Length, scripts.Select(s => s.Path).Distinct().Count());
        var arrival = scripts.ToDictionary(s => s.Path, s => s.End);
        var importers = scripts.SelectMany(s => ImportsOf(s.Path, importMap).Select(target => (Target: target, Importer: s.Path)))
            .ToLookup(edge => edge.Target, edge => edge.Importer);
        foreach (var script in scripts.Where(s => !EntryModules.Contains(s.Path)))
        {
            var importing = importers[script.Path].Where(arrival.ContainsKey).ToList();
            Assert.True(importing.Count > 0, $"no loaded module imports {script.Path}");
            var firstImporter = importing.MinBy(path => arrival[path])!;
            Assert.True(script.Start < arrival[firstImporter],
                $"{script.Path} was asked for at {script.Start:F0} ms, after {firstImporter}, which imports it, arrived at {arrival[firstImporter]:F0} ms");
        }
        // Each preload was used: the page runs every module it asks for.
        Assert.Equal(preloads.Order(StringComparer.Ordinal), scripts.Select(s => s.Path).Except(EntryModules).Order(StringComparer.Ordinal));
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task A_link_opens_its_own_view_and_asks_for_each_of_its_tiles_once_and_no_others()
    {
        var band = site.Demo.Band(site.Demo.DefaultBand);
        var canvas = band.Canvas ?? throw new InvalidOperationException("the demo band has no whole field");
        // One level below native resolution, off centre: a view the page would never choose itself.
        var link = ViewQuery.OnWholeField(site.Demo.Id, band.Name, Math.Round(canvas.Width * 0.4, 2), Math.Round(canvas.Height * 0.6, 2), canvas.MaxZoom - 1);
        await using var viewer = await site.OpenViewerAsync(link.ToQuery());
        // Opened again in the same tab with every request watched from the first; tiles come from the server or
        // the browser's cache, each counted.
        var asked = new ConcurrentQueue<string>();
        viewer.Page.Request += (_, request) =>
        {
            if (TilePath().IsMatch(new Uri(request.Url).AbsolutePath)) asked.Enqueue(request.Url);
        };
        await viewer.Page.GotoAsync("/" + link.ToQuery());
        var tiles = await viewer.WaitForTilesAsync("hdu=canvas");

        var view = viewer.Url;
        Assert.Equal((link.Field, link.Band, true), (view.Field, view.Band, view.WholeField));
        // The exact centre, not one moved to whole screen pixels (Leaflet reads it back that way once it forgets it).
        Assert.Equal((link.X, link.Y), (view.X, view.Y));
        Assert.Equal(link.Z, view.Z);

        var requested = asked.ToList();
        Assert.NotEmpty(requested);
        Assert.True(requested.Count == requested.Distinct().Count(),
            "a tile was asked for twice: " + string.Join(", ", requested.GroupBy(u => u).Where(g => g.Count() > 1).Select(g => g.Key)));
        // Only tiles of the link's zoom, and each of them still on screen: none for a view shown on the way.
        Assert.All(requested, url => Assert.Equal(link.Z, double.Parse(TilePath().Match(new Uri(url).AbsolutePath).Groups["z"].Value)));
        Assert.Equal(tiles.Select(t => t.Src).Order(StringComparer.Ordinal), requested.Order(StringComparer.Ordinal));
        Assert.All(tiles, t => Assert.True(t.Loaded, $"not loaded: {t}"));
        Assert.Empty(viewer.FailedTileRequests);
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task The_page_opens_on_its_own_view_when_the_link_names_none_and_writes_it_into_the_URL()
    {
        await using var viewer = await site.OpenViewerAsync($"?field={site.Demo.Id}");
        var tiles = await viewer.WaitForTilesAsync("hdu=canvas");
        Assert.NotEmpty(tiles);
        await viewer.Page.WaitForFunctionAsync("() => new URLSearchParams(location.search).has('z')");
        var view = viewer.Url;
        Assert.True(view.WholeField, viewer.Page.Url);
        Assert.NotNull(view.Z);
        Assert.Equal(site.Demo.DefaultBand, view.Band);
        Assert.Empty(viewer.PageErrors);
    }

    [Fact]
    public async Task The_page_still_opens_when_the_field_list_asked_for_early_is_lost()
    {
        await using var viewer = await site.OpenViewerAsync();
        await viewer.WaitForTilesAsync();
        // The first request for the field list after this point fails at the network level, as a dropped connection.
        var failed = 0;
        await viewer.Context.RouteAsync(new Regex("/api/fields$"), async route =>
        {
            if (Interlocked.Increment(ref failed) == 1) await route.AbortAsync("connectionreset");
            else await route.ContinueAsync();
        });
        await viewer.Page.ReloadAsync();
        await viewer.Page.WaitForFunctionAsync("() => document.querySelector('#hdu-picker').options.length > 0");
        var tiles = await viewer.WaitForTilesAsync("hdu=canvas");
        Assert.True(failed >= 2, $"the field list was asked for {failed} time(s): the lost answer was not asked for again");
        Assert.All(tiles, t => Assert.True(t.Loaded, $"not loaded: {t}"));
        Assert.Equal(site.Demo.Id, await viewer.Page.InputValueAsync("#field-picker"));
        Assert.True(await viewer.Page.Locator("#message").IsHiddenAsync(), "the page shows a message: " + await viewer.Page.Locator("#message").TextContentAsync());
        // The lost request itself is the only error: the browser reports it on the console.
        Assert.All(viewer.PageErrors, e => Assert.Contains("api/fields", e, StringComparison.Ordinal));
    }

    /// <summary>
    /// Static imports of a served module (import ... from 'x', import 'x', export ... from 'x'), as served paths:
    /// relative specifiers against the module's folder, bare ones through the page's import map. Read here rather
    /// than through the server's ModuleGraph, which writes the preloads: the test should not check them against
    /// their own source.
    /// </summary>
    private static IEnumerable<string> ImportsOf(string path, IReadOnlyDictionary<string, string> importMap)
    {
        var file = Path.Combine(RepositoryLayout.ServerProjectDirectory, "wwwroot", path);
        var folder = new Uri("http://page/" + path);
        foreach (Match match in ImportSpecifier().Matches(File.ReadAllText(file)))
        {
            var specifier = match.Groups["spec"].Value;
            if (importMap.TryGetValue(specifier, out var mapped)) specifier = mapped;
            else if (!specifier.StartsWith('.')) continue;
            yield return new Uri(folder, specifier).AbsolutePath.TrimStart('/');
        }
    }

    [GeneratedRegex(@"(?:\bfrom|^\s*import)\s*(?<q>['""])(?<spec>[^'""\n]+)\k<q>", RegexOptions.Multiline)]
    private static partial Regex ImportSpecifier();

    // Filled by Playwright from the page's objects.
    private sealed class ScriptTiming
    {
        public string Path { get; set; } = "";
        public string Initiator { get; set; } = "";
        public double Start { get; set; }
        public double End { get; set; }
    }

    [GeneratedRegex(@"^/tiles/[^/]+/(?<z>-?\d+)/\d+/\d+\.png$")]
    private static partial Regex TilePath();
}
