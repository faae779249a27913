using System.Net;
using System.Net.Http.Json;
using System.Text;
using System.Text.Json;
using Microsoft.AspNetCore.WebUtilities;
using Mosaic.Server.Access;
using Mosaic.Server.Tests.Meetings;
using Mosaic.Testing;

namespace Mosaic.Server.Tests.Access;

/// <summary>Share tokens: made only with the access token, signed (HMAC-SHA256), expiring, read-only, one field.</summary>
public sealed class ShareTokenTests(AccessFixture fixture) : IClassFixture<AccessFixture>
{
    /// <summary>
    /// Python's hmac and base64 modules (Debian python3, RFC 2104 HMAC with SHA-256 and RFC 4648 section 5 base64url)
    /// recompute the signature from the key file and the message "{field}\n{expiry}\nread".
    /// </summary>
    private const string VerifyScript = """
import base64, hashlib, hmac, sys
key = open(sys.argv[1], "rb").read()
prefix, field_b64, expiry, mac_b64 = sys.argv[2].split(".")
pad = lambda s: s + "=" * (-len(s) % 4)
field = base64.urlsafe_b64decode(pad(field_b64)).decode("utf-8")
mac = base64.urlsafe_b64decode(pad(mac_b64))
expected = hmac.new(key, f"{field}\n{expiry}\nread".encode("utf-8"), hashlib.sha256).digest()
print(prefix, field, expiry, len(key), hmac.compare_digest(mac, expected))
""";

    [Fact]
    [System.Runtime.Versioning.SupportedOSPlatform("linux")]
    public async Task A_token_holder_makes_a_share_token_whose_signature_python_hmac_confirms_with_the_0600_key_file()
    {
        var clock = new ManualClock();
        using var factory = new AccessFactory(fixture, fixture.TokenSettings(), clock);
        using var holder = factory.WithBearer(AccessFixture.Token);
        var share = await CreateAsync(holder, "hidden", 3600);
        Assert.Equal("hidden", share.GetProperty("field").GetString());
        Assert.Equal("read", share.GetProperty("scope").GetString());
        var expires = clock.GetUtcNow().AddHours(1);
        Assert.Equal(expires.UtcDateTime, share.GetProperty("expires").GetDateTime());

        var keyFile = Path.Combine(fixture.StateDirectory, ShareKey.FileName);
        // Owner read and write only (POSIX mode 0600), as the key must not be readable by other local users.
        Assert.Equal(UnixFileMode.UserRead | UnixFileMode.UserWrite, File.GetUnixFileMode(keyFile));
        var verdict = DebianPython.RunCode(VerifyScript, [keyFile, share.GetProperty("token").GetString()!]).Trim();
        Assert.Equal($"ms1 hidden {expires.ToUnixTimeSeconds()} 32 True", verdict);
    }

    [Fact]
    public async Task A_share_token_reads_its_field_only_and_cannot_write_meet_or_share()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings());
        using var holder = factory.WithBearer(AccessFixture.Token);
        var token = (await CreateAsync(holder, "hidden", 600)).GetProperty("token").GetString()!;
        using var reader = factory.WithBearer(token);

        var listed = JsonDocument.Parse(await reader.GetStringAsync("/api/fields")).RootElement.EnumerateArray().Select(f => f.GetProperty("id").GetString()).ToList();
        Assert.Equal(["hidden"], listed);
        await MosaicFactory.WaitForPyramidsAsync(reader, "hidden");
        using (var tile = await reader.GetAsync("/tiles/hidden/0/0/0.png"))
        {
            Assert.Equal(HttpStatusCode.OK, tile.StatusCode);
            // PNG signature, ISO/IEC 15948 section 5.2.
            Assert.Equal(new byte[] { 137, 80, 78, 71, 13, 10, 26, 10 }, (await tile.Content.ReadAsByteArrayAsync())[..8]);
        }
        using (var probe = await reader.GetAsync("/api/fields/hidden/probe?x=2&y=1"))
            Assert.Equal(HttpStatusCode.OK, probe.StatusCode);
        foreach (var other in new[] { "/api/fields/open", "/tiles/open/0/0/0.png", "/api/fields/listed/probe?x=1&y=1" })
        {
            using var response = await reader.GetAsync(other);
            Assert.True(response.StatusCode == HttpStatusCode.NotFound, $"{other}: {(int)response.StatusCode}");
        }

        var writes = new (string Path, object Body)[]
        {
            ("/api/views", new { state = new Dictionary<string, string> { ["field"] = "hidden" } }),
            ("/api/meetings", new { state = new Dictionary<string, string> { ["field"] = "hidden" } }),
            ("/api/fields/hidden/share-tokens", new { lifetimeSeconds = 600 }),
        };
        foreach (var (path, body) in writes)
        {
            using var response = await reader.PostAsJsonAsync(path, body);
            var problem = await Problem.ReadAsync(response, HttpStatusCode.Forbidden);
            Assert.Contains("read-only", problem.GetProperty("detail").GetString());
        }
        var hub = await Assert.ThrowsAnyAsync<Exception>(() => factory.ConnectAsync(origin: null, token: token));
        Assert.Contains("403", hub.Message);
    }

    [Fact]
    public async Task An_expired_token_is_refused_naming_its_expiry()
    {
        var clock = new ManualClock();
        using var factory = new AccessFactory(fixture, fixture.TokenSettings(), clock);
        using var holder = factory.WithBearer(AccessFixture.Token);
        var token = (await CreateAsync(holder, "open", 60)).GetProperty("token").GetString()!;
        using var reader = factory.WithBearer(token);
        using (var fresh = await reader.GetAsync("/api/fields/open")) Assert.Equal(HttpStatusCode.OK, fresh.StatusCode);
        clock.Advance(TimeSpan.FromSeconds(60));
        using var expired = await reader.GetAsync("/api/fields/open");
        var problem = await Problem.ReadAsync(expired, HttpStatusCode.Unauthorized);
        Assert.Contains($"expired at {clock.GetUtcNow():yyyy-MM-dd'T'HH:mm:ss'Z'}", problem.GetProperty("detail").GetString());
    }

    [Fact]
    public async Task A_tampered_or_foreign_token_is_refused_naming_why()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings());
        using var holder = factory.WithBearer(AccessFixture.Token);
        var token = (await CreateAsync(holder, "open", 600)).GetProperty("token").GetString()!;
        var parts = token.Split('.');
        var otherField = string.Join('.', parts[0], WebEncoders.Base64UrlEncode(Encoding.UTF8.GetBytes("hidden")), parts[2], parts[3]);
        var laterExpiry = string.Join('.', parts[0], parts[1], (long.Parse(parts[2]) + 86400).ToString(), parts[3]);
        var foreignKey = string.Join('.', parts[0], parts[1], parts[2], WebEncoders.Base64UrlEncode(new byte[32]));
        foreach (var tampered in new[] { otherField, laterExpiry, foreignKey })
        {
            using var response = await factory.WithBearer(tampered).GetAsync("/api/fields/open");
            var problem = await Problem.ReadAsync(response, HttpStatusCode.Unauthorized);
            Assert.Contains("signature does not match", problem.GetProperty("detail").GetString());
        }
        using var malformed = await factory.WithBearer("ms1.only-two").GetAsync("/api/fields/open");
        Assert.Contains("malformed", (await Problem.ReadAsync(malformed, HttpStatusCode.Unauthorized)).GetProperty("detail").GetString());
    }

    [Fact]
    public async Task Lifetimes_are_bounded_and_only_a_token_holder_may_make_links()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings(("anonymous", "public")));
        using var holder = factory.WithBearer(AccessFixture.Token);
        foreach (var seconds in new[] { 59L, 90L * 86400 + 1 })
        {
            using var response = await holder.PostAsJsonAsync("/api/fields/open/share-tokens", new { lifetimeSeconds = seconds });
            Assert.Equal("lifetimeSeconds", (await Problem.ReadAsync(response, HttpStatusCode.BadRequest)).GetProperty("parameter").GetString());
        }
        using (var missing = await holder.PostAsJsonAsync("/api/fields/never-there/share-tokens", new { lifetimeSeconds = 600 }))
            await Problem.ReadAsync(missing, HttpStatusCode.NotFound);
        using var anonymous = factory.CreateClient();
        using var refused = await anonymous.PostAsJsonAsync("/api/fields/open/share-tokens", new { lifetimeSeconds = 600 });
        Assert.Contains("access token", (await Problem.ReadAsync(refused, HttpStatusCode.Forbidden)).GetProperty("detail").GetString());
    }

    [Fact]
    public async Task A_share_link_signs_a_browser_in_for_that_field_until_it_expires()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings());
        using var holder = factory.WithBearer(AccessFixture.Token);
        var share = await CreateAsync(holder, "hidden", 600);
        using var browser = factory.Browser();
        using var signIn = await browser.GetAsync($"/api/access?token={share.GetProperty("token").GetString()}");
        Assert.Equal(HttpStatusCode.SeeOther, signIn.StatusCode);
        var cookie = Assert.Single(signIn.Headers.GetValues("Set-Cookie"));
        // The cookie lasts as long as the link (RFC 6265 section 5.2.1: Expires).
        Assert.Contains($"expires={share.GetProperty("expires").GetDateTime():ddd, dd MMM yyyy HH:mm:ss} GMT", cookie, StringComparison.OrdinalIgnoreCase);
        var caller = JsonDocument.Parse(await browser.GetStringAsync("/api/access")).RootElement;
        Assert.Equal("share", caller.GetProperty("caller").GetString());
        Assert.Equal("hidden", caller.GetProperty("field").GetString());
        Assert.False(caller.GetProperty("canShare").GetBoolean());
        using var other = await browser.GetAsync("/api/fields/open");
        Assert.Equal(HttpStatusCode.NotFound, other.StatusCode);
    }

    private static async Task<JsonElement> CreateAsync(HttpClient holder, string field, long seconds)
    {
        using var response = await holder.PostAsJsonAsync($"/api/fields/{field}/share-tokens", new { lifetimeSeconds = seconds });
        var body = await response.Content.ReadAsStringAsync();
        Assert.True(response.StatusCode == HttpStatusCode.Created, body);
        return JsonDocument.Parse(body).RootElement.Clone();
    }
}
