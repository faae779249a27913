using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Server.Tests.Security;

/// <summary>
/// Every response, page, script, API answer and error alike, carries the security headers: a Content-Security-Policy
/// (CSP Level 3) allowing this origin only, X-Content-Type-Options: nosniff (Fetch standard), a Referrer-Policy and no
/// framing (CSP frame-ancestors, and X-Frame-Options per RFC 7034 for older browsers).
/// </summary>
public sealed class SecurityHeaderTests(HostileDataFixture data) : IClassFixture<HostileDataFixture>
{
    public static TheoryData<string, int> Responses => new()
    {
        { "/", 200 },
        { "/index.html", 200 },
        { "/app.js", 200 },
        { "/lib/leaflet/leaflet.css", 200 },
        { "/healthz", 200 },
        { "/api/fields", 200 },
        { "/api/fields/open/probe?x=1&y=1", 200 },
        { "/api/fields/nowhere", 404 },
        { "/no/such/page", 404 },
        { "/api/fields/open/probe?x=NaN&y=1", 400 },
        { "/api/fields/open/probe?x=1&x=2&y=1", 400 },
    };

    [Theory]
    [MemberData(nameof(Responses))]
    public async Task Every_response_carries_the_security_headers(string target, int status)
    {
        var answer = await RawHttp.SendAsync(data.Port, target);
        Assert.Equal(status, answer.Status);
        var policy = answer.Headers.GetValueOrDefault("Content-Security-Policy") ?? "";
        var directives = policy.Split(';', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries)
            .ToDictionary(d => d.Split(' ')[0], d => d.Split(' ').Skip(1).ToArray());
        Assert.Equal(["'self'"], directives["default-src"]);
        Assert.Equal(["'self'"], directives["connect-src"]);
        Assert.Equal(["'self'"], directives["style-src"]);
        Assert.Equal(["'none'"], directives["frame-ancestors"]);
        Assert.Equal(["'none'"], directives["object-src"]);
        Assert.DoesNotContain("'unsafe-inline'", policy, StringComparison.Ordinal);
        Assert.DoesNotContain("'unsafe-eval'", policy, StringComparison.Ordinal);
        Assert.Equal("nosniff", answer.Headers.GetValueOrDefault("X-Content-Type-Options"));
        Assert.Equal("no-referrer", answer.Headers.GetValueOrDefault("Referrer-Policy"));
        Assert.Equal("DENY", answer.Headers.GetValueOrDefault("X-Frame-Options"));
    }

    [Fact]
    public async Task The_pages_inline_import_map_is_allowed_by_the_hash_pythons_hashlib_computes()
    {
        var page = await RawHttp.SendAsync(data.Port, "/index.html");
        // Reference: CSP Level 3 section 8.4 (a hash source is base64 of the digest of the script element's text),
        // with the text taken by Python's html.parser and hashed by hashlib (Debian python3).
        var hashes = DebianPython.RunCode("""
import base64, hashlib, html.parser, json, sys
class Scripts(html.parser.HTMLParser):
    def __init__(self):
        super().__init__(convert_charrefs=False)
        self.inline, self.open, self.text = [], False, []
    def handle_starttag(self, tag, attrs):
        if tag == "script" and "src" not in dict(attrs): self.open, self.text = True, []
    def handle_data(self, data):
        if self.open: self.text.append(data)
    def handle_endtag(self, tag):
        if tag == "script" and self.open:
            self.inline.append("".join(self.text)); self.open = False
p = Scripts()
p.feed(sys.stdin.read())
print(json.dumps(["'sha256-" + base64.b64encode(hashlib.sha256(s.encode("utf-8")).digest()).decode() + "'" for s in p.inline]))
""", standardInput: page.Body);
        var expected = JsonSerializer.Deserialize<string[]>(hashes)!;
        Assert.NotEmpty(expected);
        var scriptSources = page.Headers["Content-Security-Policy"].Split(';').Select(d => d.Trim())
            .Single(d => d.StartsWith("script-src ", StringComparison.Ordinal)).Split(' ').Skip(1).ToArray();
        Assert.Equal(["'self'", .. expected], scriptSources);
    }
}
