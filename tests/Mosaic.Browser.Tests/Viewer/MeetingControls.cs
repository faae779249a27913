using System.Text.Json;
using Microsoft.Playwright;

namespace Mosaic.Browser.Tests.Viewer;

/// <summary>
/// One page's meeting controls, driven through the toolbar's Meeting panel and the bar over the image, with a
/// record of the views the page sent as presenter and applied as follower (the page's meeting-sent and
/// meeting-view events, timed by performance.timeOrigin + performance.now(), which pages of one browser share).
/// </summary>
public sealed class MeetingControls(ViewerPage viewer)
{
    private const string Recorder = """
        () => {
          if (window.__meetingLog) return;
          const key = (state) => JSON.stringify(Object.entries(state).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
          const log = { sent: [], applied: [] };
          window.__meetingLog = log;
          document.addEventListener('meeting-sent', (e) => log.sent.push({ key: key(e.detail.state), at: e.detail.at, state: e.detail.state }));
          document.addEventListener('meeting-view', (e) => log.applied.push({ key: key(e.detail.state), at: e.detail.at, receivedAt: e.detail.receivedAt, state: e.detail.state }));
        }
        """;

    public IPage Page => viewer.Page;

    /// <summary>Starts recording this page's sent and applied views.</summary>
    public Task RecordAsync() => Page.EvaluateAsync(Recorder);

    /// <summary>Starts a meeting from the panel; returns the join link it shows.</summary>
    public async Task<string> StartAsync()
    {
        await OpenPanelAsync();
        await Page.ClickAsync("#meeting-panel [data-role=start]");
        await Page.WaitForFunctionAsync("() => document.querySelector('#meeting-join-link').value !== ''", null, Wait);
        var link = await Page.InputValueAsync("#meeting-join-link");
        await ClosePanelAsync();
        return link;
    }

    public async Task OpenPanelAsync()
    {
        if (await Page.IsHiddenAsync("#meeting-panel")) await Page.ClickAsync("#meeting-toggle");
    }

    /// <summary>Closes the panel (it drops over the image's corner, where the zoom buttons are).</summary>
    public async Task ClosePanelAsync()
    {
        if (await Page.IsVisibleAsync("#meeting-panel")) await Page.ClickAsync("#meeting-toggle");
    }

    /// <summary>The toolbar button's state: "", "presenting", "following" or "away".</summary>
    public Task<string?> RoleAsync() => Page.GetAttributeAsync("#meeting-toggle", "data-meeting");

    public async Task WaitForRoleAsync(string role) =>
        await Page.WaitForFunctionAsync("r => document.querySelector('#meeting-toggle').dataset.meeting === r", role, Wait);

    /// <summary>Waits until the panel says <paramref name="count"/> people are in the meeting.</summary>
    public async Task WaitForParticipantsAsync(int count) =>
        await Page.WaitForFunctionAsync("n => document.querySelector('.meeting-bar')?.dataset.count === String(n)", count, Wait);

    public Task<string> BarTextAsync() => Page.InnerTextAsync(".meeting-bar [data-role=text]");

    public Task<string?> ConnectionAsync() => Page.GetAttributeAsync(".meeting-bar", "data-connection");

    public Task<bool> RejoinVisibleAsync() => Page.IsVisibleAsync(".meeting-bar [data-role=rejoin]");

    public Task RejoinAsync() => Page.ClickAsync(".meeting-bar [data-role=rejoin]");

    /// <summary>Asks for a hand-over; returns the hand-over link shown.</summary>
    public async Task<string> HandOverAsync()
    {
        await OpenPanelAsync();
        await Page.ClickAsync("#meeting-panel [data-role=handover]");
        await Page.WaitForFunctionAsync("() => document.querySelector('#meeting-panel [data-role=handover-link]').value !== ''", null, Wait);
        var link = await Page.InputValueAsync("#meeting-panel [data-role=handover-link]");
        await ClosePanelAsync();
        return link;
    }

    /// <summary>Types a hand-over code (or link) into the follower's panel and presses Present.</summary>
    public async Task TakeOverAsync(string code)
    {
        await OpenPanelAsync();
        await Page.FillAsync("#meeting-panel [data-role=takeover-code]", code);
        await Page.ClickAsync("#meeting-panel [data-role=takeover-form] button[type=submit]");
        await ClosePanelAsync();
    }

    /// <summary>
    /// The newest state this page sent as presenter, and when it first sent that state after <paramref name="since"/>
    /// (a time on the shared clock; a state can come back, as when a zoom in is undone).
    /// </summary>
    public async Task<(string Key, double At, Dictionary<string, string> State)> LastSentAsync(double since = 0)
    {
        var entry = await Page.EvaluateAsync<JsonElement>("""
            since => { const log = window.__meetingLog.sent.filter((e) => e.at > since); if (log.length === 0) return null;
                       const last = log[log.length - 1]; const first = log.find((e) => e.key === last.key);
                       return { key: last.key, at: first.at, state: last.state }; }
            """, since);
        if (entry.ValueKind == JsonValueKind.Null) throw new InvalidOperationException("the presenter page sent no view");
        return (entry.GetProperty("key").GetString()!, entry.GetProperty("at").GetDouble(), ToMap(entry.GetProperty("state")));
    }

    /// <summary>
    /// The newest state sent after <paramref name="since"/> once the presenter has settled: something was sent, the
    /// map is not animating, and nothing new was sent for 300 ms. A click's zoom can start after the tiles of the old
    /// view look complete, so waiting for tiles alone may look too early on a busy machine.
    /// </summary>
    public async Task<(string Key, double At, Dictionary<string, string> State)> SettledSentAsync(double since)
    {
        await Page.WaitForFunctionAsync("""
            since => { const log = window.__meetingLog.sent.filter((e) => e.at > since); if (log.length === 0) return false;
                       if (document.querySelector('.leaflet-zoom-anim, .leaflet-pan-anim')) return false;
                       return performance.timeOrigin + performance.now() - log[log.length - 1].at > 300; }
            """, since, new PageWaitForFunctionOptions { Timeout = 20_000, PollingInterval = 20 });
        return await LastSentAsync(since);
    }

    /// <summary>When this page first applied the state with <paramref name="key"/>; waits up to ten seconds for it unless told.</summary>
    public async Task<double> AppliedAtAsync(string key, double since = 0, float timeoutMs = 10_000) => (await AppliedAsync(key, since, timeoutMs)).At;

    /// <summary>
    /// When the state with <paramref name="key"/> first arrived here after <paramref name="since"/> and when it was
    /// applied; waits up to <paramref name="timeoutMs"/> (ten seconds unless told).
    /// </summary>
    public async Task<(double ReceivedAt, double At)> AppliedAsync(string key, double since = 0, float timeoutMs = 10_000)
    {
        var handle = await Page.WaitForFunctionAsync(
            "([k, since]) => { const e = window.__meetingLog.applied.find((a) => a.key === k && a.receivedAt > since); return e ? [e.receivedAt, e.at] : null; }",
            new object[] { key, since }, new PageWaitForFunctionOptions { Timeout = timeoutMs, PollingInterval = 10 });
        var times = await handle.JsonValueAsync<double[]>();
        return (times[0], times[1]);
    }

    /// <summary>How many states this page has applied as follower so far.</summary>
    public Task<int> AppliedCountAsync() => Page.EvaluateAsync<int>("() => window.__meetingLog.applied.length");

    /// <summary>The shared clock now in this page.</summary>
    public Task<double> NowAsync() => Page.EvaluateAsync<double>("() => performance.timeOrigin + performance.now()");

    /// <summary>The presenter's pointer as drawn here: its FITS position and its tip on screen relative to the image view, or null.</summary>
    public async Task<(double X, double Y, double ScreenX, double ScreenY)?> PointerAsync()
    {
        var found = await Page.EvaluateAsync<JsonElement>("""
            () => { const p = document.querySelector('#image-view .meeting-pointer'); if (!p) return null;
                    const map = document.querySelector('#image-view').getBoundingClientRect(); const r = p.getBoundingClientRect();
                    // The icon's anchor is one pixel in from its top-left corner (meeting-pointer.js).
                    return { x: Number(p.dataset.x), y: Number(p.dataset.y), sx: r.left - map.left + 1, sy: r.top - map.top + 1 }; }
            """);
        if (found.ValueKind == JsonValueKind.Null) return null;
        return (found.GetProperty("x").GetDouble(), found.GetProperty("y").GetDouble(), found.GetProperty("sx").GetDouble(), found.GetProperty("sy").GetDouble());
    }

    private static PageWaitForFunctionOptions Wait => new() { Timeout = 10_000, PollingInterval = 10 };

    private static Dictionary<string, string> ToMap(JsonElement element) =>
        element.EnumerateObject().ToDictionary(p => p.Name, p => p.Value.GetString()!);
}
