using System.Globalization;
using System.Net;
using System.Text.Json;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Viewer;

namespace Mosaic.Browser.Tests;

/// <summary>
/// Views saved from the share panel: kept by the server across a restart on the same --state folder, opened by
/// their short link /v/{id}, listed per field, and deleted only by the browser that holds the delete key.
/// </summary>
[Collection(BrowserCollection.Name)]
public sealed class SavedViewTests(MosaicSite site)
{
    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    [Fact]
    public async Task A_saved_view_survives_a_server_restart_and_opens_from_its_short_link()
    {
        var band = site.Demo.Bands.First(b => b.Name != site.Demo.DefaultBand).Name;
        var canvas = site.Demo.Band(band).WholeField;
        var (x, y) = (Math.Round(canvas.Width * 0.38 + 0.11, 2), Math.Round(canvas.Height * 0.47 + 0.29, 2));
        // A server of its own on a --state folder of its own, stopped and started again below.
        var stateDirectory = site.NewStateDirectory();
        await using var before = await site.StartSeparateServerAsync(stateDirectory);
        var address = before.BaseAddress;
        await using var viewer = await site.OpenViewerAsync(
            $"?field={MosaicSite.DemoFieldId}&band={band}&hdu=canvas&x={Text(x)}&y={Text(y)}&z={canvas.MaxZoom + 1}&stretch=sqrt&grid=1", address);
        await viewer.WaitForTilesAsync("stretch=sqrt");
        var link = await viewer.WaitForSkyUrlAsync();
        var view = viewer.Url;

        var share = new ShareControls(viewer);
        Assert.Equal(link, await share.LinkAsync());
        var title = $"Knot at the arc's end {Guid.NewGuid():N}"[..40];
        const string note = "Compare with the faint shell to the east.\nThe second line of the note.";
        var status = await share.SaveAsync(title, note);
        Assert.StartsWith("Saved: ", status);
        var saved = Assert.Single(await share.ListAsync(), e => e.Title == title);
        Assert.Equal(note, saved.Note);
        Assert.True(saved.CanDelete);
        Assert.Equal($"v/{saved.Id}", saved.Href);
        Assert.EndsWith($"/v/{saved.Id}", status);

        // The stored state is the link's query parameters, exactly (the saved views contract).
        var stored = await site.GetJsonAsync($"api/views/{saved.Id}", address);
        Assert.Equal(Pairs(QueryString.Parse(link)), Pairs(StateOf(stored)));
        Assert.Equal((title, note), (stored.GetProperty("title").GetString(), stored.GetProperty("note").GetString()));

        // The same address, so the page that saved it (its origin, its stored keys) talks to the new server.
        await before.DisposeAsync();
        Assert.True(File.Exists(Path.Combine(stateDirectory, "views.db")), "no views.db in the --state folder");
        await using var after = await site.StartSeparateServerAsync(stateDirectory, address);

        // A browser that has never seen it opens the short link: the server's redirect lands on the same view.
        await using var other = await site.OpenViewerAsync($"v/{saved.Id}", address);
        await other.WaitForTilesAsync("stretch=sqrt");
        Assert.Equal(link, await other.WaitForSkyUrlAsync());
        var opened = other.Url;
        Assert.Equal((view.X, view.Y, view.Z, true), (opened.X, opened.Y, opened.Z, opened.WholeField));
        Assert.Equal("true", await other.Page.GetAttributeAsync("#grid-toggle", "aria-pressed"));
        Assert.Equal("sqrt", await other.Page.InputValueAsync("#stretch-picker"));
        // Listed there too, without a delete button: that browser holds no key for it.
        var listed = Assert.Single(await new ShareControls(other).ListAsync(), e => e.Id == saved.Id);
        Assert.Equal((title, false), (listed.Title, listed.CanDelete));
        await other.SaveScreenshotAsync("saved-view-after-restart");

        // The page that saved it still can delete it, after the restart.
        Assert.True(Assert.Single(await share.ListAsync(), e => e.Id == saved.Id).CanDelete);
        Assert.True(viewer.PageErrors.Count == 0, string.Join("\n", viewer.PageErrors));
        Assert.True(other.PageErrors.Count == 0, string.Join("\n", other.PageErrors));
    }

    [Fact]
    public async Task A_saved_view_is_deleted_only_with_its_key()
    {
        await using var viewer = await site.OpenViewerAsync($"?field={MosaicSite.DemoFieldId}");
        await viewer.WaitForTilesAsync();
        var share = new ShareControls(viewer);
        var title = $"To be deleted {Guid.NewGuid():N}"[..30];
        await share.SaveAsync(title, "");
        var saved = Assert.Single(await share.ListAsync(), e => e.Title == title);
        var keys = JsonDocument.Parse(await viewer.Page.EvaluateAsync<string>("() => localStorage.getItem('mosaic.saved-view-keys')")).RootElement;
        var key = keys.GetProperty(saved.Id).GetString()!;
        // 128 random bits in base64url: 22 characters (the saved views contract).
        Assert.Matches("^[A-Za-z0-9_-]{22}$", key);

        using var http = site.CreateHttpClient();
        using (var noKey = await http.DeleteAsync($"api/views/{saved.Id}"))
            Assert.Equal(HttpStatusCode.Forbidden, noKey.StatusCode);
        var wrong = (key[0] == 'A' ? "B" : "A") + key[1..];
        using (var wrongKey = await http.DeleteAsync($"api/views/{saved.Id}?key={wrong}"))
            Assert.Equal(HttpStatusCode.Forbidden, wrongKey.StatusCode);
        using (var still = await http.GetAsync($"api/views/{saved.Id}"))
            Assert.Equal(HttpStatusCode.OK, still.StatusCode);

        // Another browser lists it but offers no delete.
        await using (var other = await site.OpenViewerAsync($"?field={MosaicSite.DemoFieldId}"))
            Assert.False(Assert.Single(await new ShareControls(other).ListAsync(), e => e.Id == saved.Id).CanDelete);

        // The browser that saved it deletes it with the key it kept.
        await share.DeleteAsync(saved.Id);
        Assert.Contains($"Deleted “{title}”", await share.ListStatusAsync());
        Assert.DoesNotContain(await share.ListAsync(), e => e.Id == saved.Id);
        using (var gone = await http.GetAsync($"api/views/{saved.Id}"))
            Assert.Equal(HttpStatusCode.NotFound, gone.StatusCode);
        Assert.Equal("null", await viewer.Page.EvaluateAsync<string>(
            $"() => JSON.stringify(JSON.parse(localStorage.getItem('mosaic.saved-view-keys'))['{saved.Id}'] ?? null)"));
        Assert.True(viewer.PageErrors.Count == 0, string.Join("\n", viewer.PageErrors));
    }

    private static string[] Pairs(IReadOnlyDictionary<string, string> values) =>
        [.. values.Select(p => $"{p.Key}={p.Value}").Order(StringComparer.Ordinal)];

    private static Dictionary<string, string> StateOf(JsonElement stored) =>
        stored.GetProperty("state").EnumerateObject().ToDictionary(p => p.Name, p => p.Value.GetString()!, StringComparer.Ordinal);

    private static string Text(double value) => value.ToString("R", Invariant);
}
