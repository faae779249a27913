using Mosaic.Browser.Tests.Hosting;

namespace Mosaic.Browser.Tests;

[Collection(BrowserCollection.Name)]
public sealed class FieldPickerTests(MosaicSite site)
{
    [Fact]
    public async Task The_field_picker_lists_an_unreadable_file_disabled_with_its_error()
    {
        var fields = await site.GetJsonAsync("api/fields");
        var broken = fields.EnumerateArray().Single(f => f.GetProperty("error").ValueKind == System.Text.Json.JsonValueKind.String);
        var brokenId = broken.GetProperty("id").GetString()!;
        var error = broken.GetProperty("error").GetString()!;
        Assert.False(string.IsNullOrWhiteSpace(error));

        await using var viewer = await site.OpenViewerAsync();
        await viewer.WaitForTilesAsync();
        await viewer.SaveScreenshotAsync("field-picker");

        var options = await viewer.Page.EvalOnSelectorAllAsync<FieldOption[]>("#field-picker option",
            "os => os.map(o => ({ value: o.value, text: o.textContent, title: o.title, disabled: o.disabled, selected: o.selected }))");
        Assert.Equal(fields.EnumerateArray().Select(f => f.GetProperty("id").GetString()), options.Select(o => o.Value));

        var brokenOption = options.Single(o => o.Value == brokenId);
        Assert.True(brokenOption.Disabled, "an unreadable field cannot be picked");
        Assert.StartsWith(brokenId, brokenOption.Text);
        Assert.Contains("unreadable", brokenOption.Text);
        Assert.Contains(error, brokenOption.Title);
        // The start of the reason is in the entry itself, where no tooltip is needed to see it.
        Assert.Contains(error[..Math.Min(error.Length, 30)], brokenOption.Text);

        var demo = options.Single(o => o.Value == MosaicSite.DemoFieldId);
        Assert.False(demo.Disabled);
        Assert.True(demo.Selected);

        var note = viewer.Page.Locator("#field-note");
        Assert.True(await note.IsVisibleAsync());
        Assert.Equal("1 field cannot be read", await note.TextContentAsync());
        Assert.Contains(error, await note.GetAttributeAsync("title") ?? "");
    }

    // Settable: Playwright fills it from a JS object.
    private sealed class FieldOption
    {
        public string Value { get; set; } = "";

        public string Text { get; set; } = "";

        public string Title { get; set; } = "";

        public bool Disabled { get; set; }

        public bool Selected { get; set; }
    }
}
