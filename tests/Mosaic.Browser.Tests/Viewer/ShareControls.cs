using Microsoft.Playwright;

namespace Mosaic.Browser.Tests.Viewer;

/// <summary>The share panel of one viewer page, driven through its controls: the link box, the save form and the list.</summary>
public sealed class ShareControls(ViewerPage viewer)
{
    private IPage Page => viewer.Page;

    public async Task OpenAsync()
    {
        if (await Page.IsHiddenAsync("#share-panel")) await Page.ClickAsync("#share-toggle");
        await Page.WaitForSelectorAsync("#share-panel", new PageWaitForSelectorOptions { State = WaitForSelectorState.Visible });
    }

    public async Task CloseAsync()
    {
        if (await Page.IsVisibleAsync("#share-panel")) await Page.ClickAsync("#share-toggle");
        await Page.WaitForSelectorAsync("#share-panel", new PageWaitForSelectorOptions { State = WaitForSelectorState.Hidden });
    }

    /// <summary>The link the panel offers, once it has one (the copy button is enabled when it is final).</summary>
    public async Task<string> LinkAsync()
    {
        await OpenAsync();
        await Page.WaitForFunctionAsync("() => { const b = document.querySelector('#share-panel [data-role=copy]'); return !b.disabled && document.querySelector('#share-panel [data-role=link]').value !== ''; }",
            null, new PageWaitForFunctionOptions { Timeout = 10_000, PollingInterval = 20 });
        return await Page.InputValueAsync("#share-panel [data-role=link]");
    }

    /// <summary>Saves the view with the form; returns the status line the panel shows afterwards.</summary>
    public async Task<string> SaveAsync(string title, string note)
    {
        await OpenAsync();
        await Page.FillAsync("#share-panel [data-role=save-form] input[name=title]", title);
        await Page.FillAsync("#share-panel [data-role=save-form] textarea[name=note]", note);
        await Page.ClickAsync("#share-panel [data-role=save-form] button[type=submit]");
        await Page.WaitForFunctionAsync("() => { const t = document.querySelector('#share-panel [data-role=save-status]').textContent; return t !== '' && t !== 'Saving…'; }",
            null, new PageWaitForFunctionOptions { Timeout = 10_000, PollingInterval = 20 });
        return await Page.TextContentAsync("#share-panel [data-role=save-status]") ?? "";
    }

    /// <summary>The saved views listed, once the list has loaded: id, title, note and whether it has a delete button.</summary>
    public async Task<IReadOnlyList<SavedViewEntry>> ListAsync()
    {
        await OpenAsync();
        await Page.WaitForFunctionAsync("() => document.querySelector('#share-panel [data-role=list-status]').textContent !== 'Loading…'",
            null, new PageWaitForFunctionOptions { Timeout = 10_000, PollingInterval = 20 });
        var rows = await Page.EvalOnSelectorAllAsync<string[][]>("#share-panel .saved-view",
            @"items => items.map(i => [i.dataset.id, i.querySelector('.saved-view-title').textContent,
                                      i.querySelector('.saved-view-note')?.textContent ?? '',
                                      i.querySelector('[data-role=delete]') ? '1' : '0',
                                      i.querySelector('.saved-view-title').getAttribute('href')])");
        return [.. rows.Select(r => new SavedViewEntry(r[0], r[1], r[2], r[3] == "1", r[4]))];
    }

    /// <summary>Clicks the delete button of a saved view and waits for the list to be loaded again.</summary>
    public async Task DeleteAsync(string id)
    {
        await Page.ClickAsync($"#share-panel .saved-view[data-id='{id}'] [data-role=delete]");
        await Page.WaitForFunctionAsync("id => !document.querySelector(`#share-panel .saved-view[data-id='${id}']`)", id,
            new PageWaitForFunctionOptions { Timeout = 10_000, PollingInterval = 20 });
    }

    public async Task<string> ListStatusAsync() => await Page.TextContentAsync("#share-panel [data-role=list-status]") ?? "";
}
