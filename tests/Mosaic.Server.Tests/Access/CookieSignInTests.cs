using System.Net;
using System.Text.Json;

namespace Mosaic.Server.Tests.Access;

/// <summary>The browser signs in once, by ?token= or the /signin form, and then carries an HttpOnly, SameSite=Strict cookie.</summary>
public sealed class CookieSignInTests(AccessFixture fixture) : IClassFixture<AccessFixture>
{
    [Fact]
    public async Task A_token_in_the_address_sets_the_cookie_and_moves_on_to_the_same_address_without_it()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings());
        using var client = factory.Browser();
        using var request = new HttpRequestMessage(HttpMethod.Get, $"/?field=open&token={AccessFixture.Token}&z=2");
        request.Headers.Accept.ParseAdd("text/html");
        using var response = await client.SendAsync(request);
        var page = await response.Content.ReadAsStringAsync();
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
        // HTML 5.x "refresh" pragma: content is "0; url=<address>"; the address keeps every parameter but the token.
        Assert.Contains("<meta http-equiv=\"refresh\" content=\"0; url=/?field=open&amp;z=2\">", page);
        Assert.DoesNotContain(AccessFixture.Token, page);

        var cookie = Assert.Single(response.Headers.GetValues("Set-Cookie"));
        // RFC 6265 section 4.1.2.6 (HttpOnly) and the SameSite attribute (RFC 6265bis section 4.1.2.7); no Secure over http.
        Assert.StartsWith("mosaic-access=", cookie);
        Assert.Contains("httponly", cookie, StringComparison.OrdinalIgnoreCase);
        Assert.Contains("samesite=strict", cookie, StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain("secure;", cookie + ";", StringComparison.OrdinalIgnoreCase);
        Assert.DoesNotContain(AccessFixture.Token, cookie);

        // The same client, now with the cookie only, sees every field.
        var ids = JsonDocument.Parse(await client.GetStringAsync("/api/fields")).RootElement.EnumerateArray().Select(f => f.GetProperty("id").GetString()).ToList();
        Assert.Equal(["hidden", "listed", "open"], ids.Order());
        var caller = JsonDocument.Parse(await client.GetStringAsync("/api/access")).RootElement;
        Assert.Equal("full", caller.GetProperty("caller").GetString());
        Assert.True(caller.GetProperty("canShare").GetBoolean());
    }

    [Fact]
    public async Task Over_https_the_cookie_is_secure()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings());
        using var client = factory.Browser(https: true);
        using var response = await client.GetAsync($"/api/access?token={AccessFixture.Token}");
        // A program (no text/html in Accept) is sent on with 303 See Other (RFC 9110 section 15.4.4).
        Assert.Equal(HttpStatusCode.SeeOther, response.StatusCode);
        Assert.Equal("/api/access", response.Headers.Location!.OriginalString);
        // RFC 6265 section 4.1.2.5: Secure keeps the cookie off plain http.
        Assert.Contains("secure", Assert.Single(response.Headers.GetValues("Set-Cookie")), StringComparison.OrdinalIgnoreCase);
    }

    [Fact]
    public async Task The_sign_in_form_accepts_the_token_refuses_a_wrong_one_and_returns_only_to_this_server()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings());
        using var client = factory.Browser();
        using var wrong = await client.PostAsync("/signin", new FormUrlEncodedContent([new("token", "nope-nope-nope-nope-nope"), new("return", "/?field=open")]));
        Assert.Equal(HttpStatusCode.Unauthorized, wrong.StatusCode);
        Assert.Contains("not an access token", await wrong.Content.ReadAsStringAsync());
        Assert.False(wrong.Headers.Contains("Set-Cookie"));

        using var elsewhere = await client.PostAsync("/signin", new FormUrlEncodedContent([new("token", AccessFixture.Token), new("return", "//elsewhere.example/steal")]));
        Assert.Equal(HttpStatusCode.Redirect, elsewhere.StatusCode);
        Assert.Equal("/", elsewhere.Headers.Location!.OriginalString);

        using var right = await client.PostAsync("/signin", new FormUrlEncodedContent([new("token", AccessFixture.Token), new("return", "/?field=hidden")]));
        Assert.Equal(HttpStatusCode.Redirect, right.StatusCode);
        Assert.Equal("/?field=hidden", right.Headers.Location!.OriginalString);
        using var fields = await client.GetAsync("/api/fields/hidden");
        Assert.Equal(HttpStatusCode.OK, fields.StatusCode);
    }

    [Fact]
    public async Task A_wrong_token_in_the_address_gets_the_sign_in_form_naming_why()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings());
        using var client = factory.Browser();
        using var request = new HttpRequestMessage(HttpMethod.Get, "/?token=not-a-token-of-this-server");
        request.Headers.Accept.ParseAdd("text/html");
        using var response = await client.SendAsync(request);
        Assert.Equal(HttpStatusCode.Unauthorized, response.StatusCode);
        var page = await response.Content.ReadAsStringAsync();
        Assert.Contains("id=\"signin-problem\"", page);
        Assert.Contains("not an access token", page);
        Assert.DoesNotContain("not-a-token-of-this-server", page);
    }

    [Fact]
    public async Task A_cookie_stops_working_once_its_token_is_taken_out_of_the_file()
    {
        var tokens = Path.Combine(fixture.Root, $"tokens-{Guid.NewGuid():N}.txt");
        File.WriteAllText(tokens, AccessFixture.Token + "\n");
        string cookie;
        using (var before = new AccessFactory(fixture, fixture.TokenSettings(("access-token-file", tokens))))
        {
            using var client = before.Browser();
            using var signIn = await client.GetAsync($"/api/access?token={AccessFixture.Token}");
            cookie = Assert.Single(signIn.Headers.GetValues("Set-Cookie")).Split(';')[0];
            using var again = new HttpRequestMessage(HttpMethod.Get, "/api/fields/hidden");
            again.Headers.Add("Cookie", cookie);
            using var ok = await before.CreateClient().SendAsync(again);
            Assert.Equal(HttpStatusCode.OK, ok.StatusCode);
        }
        File.WriteAllText(tokens, AccessFixture.SecondToken + "\n");
        using var after = new AccessFactory(fixture, fixture.TokenSettings(("access-token-file", tokens)));
        using var stale = new HttpRequestMessage(HttpMethod.Get, "/api/fields/hidden");
        stale.Headers.Add("Cookie", cookie);
        using var refused = await after.CreateClient().SendAsync(stale);
        await Problem.ReadAsync(refused, HttpStatusCode.Unauthorized);
    }
}
