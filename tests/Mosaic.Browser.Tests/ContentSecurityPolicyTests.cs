using Microsoft.Playwright;
using Mosaic.Browser.Tests.Hosting;
using Mosaic.Browser.Tests.Viewer;

namespace Mosaic.Browser.Tests;

/// <summary>
/// The viewer works under its own Content-Security-Policy in Chromium: tiles, the import map, panels, the picture
/// export and a live meeting's WebSocket raise no violation (CSP Level 3 reports each as a securitypolicyviolation
/// event and a console error). The control shows the policy is enforced: an inline script added later is blocked.
/// </summary>
[Collection(BrowserCollection.Name)]
public sealed class ContentSecurityPolicyTests(MosaicSite site)
{
    private const string Recorder = """
        window.__csp = [];
        document.addEventListener('securitypolicyviolation', e =>
          window.__csp.push(e.violatedDirective + ' ' + (e.blockedURI || '(inline)') + ' at ' + e.sourceFile + ':' + e.lineNumber));
        """;

    [Fact]
    public async Task The_viewer_raises_no_violation_of_its_policy_and_the_policy_blocks_an_inline_script()
    {
        await using var viewer = await site.OpenViewerAsync();
        // Recorded from the first byte of the page: the listener goes in before any of the page's own scripts.
        await viewer.Context.AddInitScriptAsync(Recorder);
        var document = await viewer.Page.ReloadAsync();
        Assert.NotNull(document);
        var policy = await document.HeaderValueAsync("content-security-policy") ?? "";
        Assert.Contains("default-src 'self'", policy, StringComparison.Ordinal);
        Assert.Contains("frame-ancestors 'none'", policy, StringComparison.Ordinal);
        Assert.Equal("nosniff", await document.HeaderValueAsync("x-content-type-options"));

        await viewer.Page.WaitForFunctionAsync("() => document.querySelector('#hdu-picker').options.length > 0");
        await viewer.WaitForTilesAsync();
        foreach (var toggle in new[] { "#display-panel-toggle", "#export-toggle", "#marker-toggle", "#share-toggle" })
        {
            var button = viewer.Page.Locator(toggle);
            if (!await button.IsEnabledAsync()) continue;
            await button.ClickAsync();
            await viewer.Page.WaitForTimeoutAsync(300);
            await button.ClickAsync();
        }
        // A live meeting opens the hub's WebSocket (connect-src).
        var meeting = new MeetingControls(viewer);
        await meeting.StartAsync();
        Assert.Equal("presenting", await meeting.RoleAsync());
        await viewer.Page.WaitForTimeoutAsync(500);

        var violations = await viewer.Page.EvaluateAsync<string[]>("() => window.__csp");
        Assert.True(violations.Length == 0, "violations: " + string.Join("; ", violations));
        Assert.DoesNotContain(viewer.PageErrors, e => e.Contains("Content Security Policy", StringComparison.OrdinalIgnoreCase));

        // The control: an inline script the policy has no hash for does not run and is reported.
        var ran = await viewer.Page.EvaluateAsync<bool>("""
            () => new Promise(resolve => {
              const script = document.createElement('script');
              script.textContent = 'window.__inlineRan = true;';
              document.body.append(script);
              setTimeout(() => resolve(window.__inlineRan === true), 200);
            })
            """);
        Assert.False(ran, "an inline script ran under the policy");
        violations = await viewer.Page.EvaluateAsync<string[]>("() => window.__csp");
        Assert.Contains(violations, v => v.StartsWith("script-src", StringComparison.Ordinal));
    }
}
