using System.Net.Http.Headers;
using System.Net.Http.Json;
using System.Text.Json;
using Microsoft.Playwright;
using Mosaic.Browser.Tests.Hosting;

namespace Mosaic.Browser.Tests;

/// <summary>A signed share link opened in a fresh browser on a server that needs a token: that field's tiles show, other fields are not there.</summary>
[Collection(BrowserCollection.Name)]
public sealed class ShareLinkTests(MosaicSite site)
{
    private const string Token = "browser-test-access-token-0042";

    [Fact]
    public async Task A_share_link_opens_its_field_in_a_fresh_browser_and_no_other()
    {
        var root = Path.GetDirectoryName(site.DataDirectory)!;
        var tokens = Path.Combine(root, $"tokens-{Guid.NewGuid():N}.txt");
        await File.WriteAllTextAsync(tokens, Token + "\n");
        await using var server = await ServerProcess.StartAsync(site.DataDirectory, Path.Combine(root, "cache"), site.NewStateDirectory(),
            moreArguments: ["--access-token-file", tokens]);
        using var holder = new HttpClient { BaseAddress = server.BaseAddress, Timeout = TimeSpan.FromSeconds(30) };
        holder.DefaultRequestHeaders.Authorization = new AuthenticationHeaderValue("Bearer", Token);
        var all = JsonDocument.Parse(await holder.GetStringAsync("api/fields")).RootElement.EnumerateArray().Select(f => f.GetProperty("id").GetString()).ToList();
        Assert.Contains(MosaicSite.UnsolvedFieldId, all);
        await WaitForPyramidsAsync(holder, MosaicSite.DemoFieldId);

        // A browser that signed in with the access token makes the read-only link in the share panel.
        await using var opener = await site.OpenViewerAsync();
        var browser = opener.Context.Browser!;
        await using var owner = await browser.NewContextAsync(new BrowserNewContextOptions { BaseURL = server.BaseAddress.ToString() });
        var ownerPage = await owner.NewPageAsync();
        await ownerPage.GotoAsync($"/?field={MosaicSite.DemoFieldId}&token={Token}");
        await ownerPage.WaitForURLAsync(url => !url.Contains("token=", StringComparison.Ordinal), new PageWaitForURLOptions { Timeout = 15_000 });
        await ownerPage.WaitForFunctionAsync("() => document.querySelector('#hdu-picker')?.options.length > 0", null, new PageWaitForFunctionOptions { Timeout = 30_000 });
        await ownerPage.ClickAsync("#share-toggle");
        await ownerPage.WaitForSelectorAsync("#share-panel [data-role=signed-link-section]", new PageWaitForSelectorOptions { State = WaitForSelectorState.Visible, Timeout = 10_000 });
        await ownerPage.WaitForFunctionAsync("() => !document.querySelector('#share-panel [data-role=copy]').disabled", null, new PageWaitForFunctionOptions { Timeout = 10_000 });
        await ownerPage.SelectOptionAsync("#share-panel [data-role=signed-lifetime]", "3600");
        await ownerPage.ClickAsync("#share-panel [data-role=make-signed]");
        await ownerPage.WaitForFunctionAsync("() => document.querySelector('#share-panel [data-role=signed-link]').value !== ''", null, new PageWaitForFunctionOptions { Timeout = 10_000 });
        var link = await ownerPage.InputValueAsync("#share-panel [data-role=signed-link]");
        Assert.StartsWith(server.BaseAddress.ToString().TrimEnd('/'), link);
        Assert.Contains("token=ms1.", link);
        Assert.StartsWith("Works until", await ownerPage.TextContentAsync("#share-panel [data-role=signed-status]"));

        // The link opened in a context of its own: no cookie, no cache, no history.
        await using var context = await browser.NewContextAsync(new BrowserNewContextOptions
        {
            BaseURL = server.BaseAddress.ToString(),
            ViewportSize = new ViewportSize { Width = 1280, Height = 800 },
        });
        var page = await context.NewPageAsync();
        await page.GotoAsync(link);
        await page.WaitForURLAsync(url => !url.Contains("token=", StringComparison.Ordinal), new PageWaitForURLOptions { Timeout = 15_000 });
        Assert.Contains($"field={MosaicSite.DemoFieldId}", page.Url);

        await page.WaitForFunctionAsync("() => document.querySelector('#hdu-picker')?.options.length > 0", null, new PageWaitForFunctionOptions { Timeout = 30_000 });
        var options = await page.EvalOnSelectorAllAsync<string[]>("#field-picker option", "os => os.map(o => o.value)");
        Assert.Equal([MosaicSite.DemoFieldId], options);

        // Tiles of the shared field load (complete, decoded, non-empty) through the sign-in cookie alone.
        await page.WaitForFunctionAsync(
            @"() => {
                const tiles = [...document.querySelectorAll('#image-view .image-tiles img.leaflet-tile')];
                return tiles.length > 0 && tiles.every(t => t.complete && t.naturalWidth > 0 && t.src.includes('tiles/demo/'));
            }", null, new PageWaitForFunctionOptions { Timeout = 30_000, PollingInterval = 100 });

        // The cookie is HttpOnly: the page's scripts cannot read it (RFC 6265 section 5.2.6).
        Assert.DoesNotContain("mosaic-access", await page.EvaluateAsync<string>("() => document.cookie"));
        var statuses = await page.EvaluateAsync<int[]>(
            $"async () => Promise.all(['api/fields/{MosaicSite.UnsolvedFieldId}', 'tiles/{MosaicSite.UnsolvedFieldId}/0/0/0.png', 'api/fields/{MosaicSite.DemoFieldId}']" +
            ".map(async p => (await fetch(p)).status))");
        Assert.Equal([404, 404, 200], statuses);

        // The panel says what the link allows and offers no link of its own.
        await page.ClickAsync("#share-toggle");
        await page.WaitForSelectorAsync("#share-panel [data-role=access-note]", new PageWaitForSelectorOptions { State = WaitForSelectorState.Visible, Timeout = 10_000 });
        Assert.Contains($"read-only link to field “{MosaicSite.DemoFieldId}”", await page.TextContentAsync("#share-panel [data-role=access-note]"));
        Assert.True(await page.IsHiddenAsync("#share-panel [data-role=signed-link-section]"));
    }

    private static async Task WaitForPyramidsAsync(HttpClient client, string field)
    {
        var deadline = DateTime.UtcNow + TimeSpan.FromMinutes(2);
        while (true)
        {
            var doc = JsonDocument.Parse(await client.GetStringAsync($"api/fields/{field}")).RootElement;
            var states = doc.GetProperty("bands").EnumerateArray().SelectMany(b => b.GetProperty("hdus").EnumerateArray())
                .Select(h => h.GetProperty("pyramid").GetProperty("state").GetString()).ToList();
            if (states.Count > 0 && states.All(s => s == "ready")) return;
            if (DateTime.UtcNow > deadline) throw new TimeoutException($"pyramids of {field} not ready: {doc}");
            await Task.Delay(250);
        }
    }
}
