using System.Net;
using System.Text.Json;
using Microsoft.Extensions.Configuration;
using Mosaic.Server.Access;

namespace Mosaic.Server.Tests.Access;

/// <summary>With --access-token-file, every request but /healthz and /signin needs a token (RFC 6750 bearer tokens).</summary>
public sealed class TokenRequiredTests(AccessFixture fixture) : IClassFixture<AccessFixture>
{
    [Fact]
    public async Task Without_a_token_the_api_and_tiles_answer_401_problem_details_with_a_bearer_challenge()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings());
        using var client = factory.CreateClient();
        foreach (var path in new[] { "/api/fields", "/api/fields/open", "/tiles/open/0/0/0.png", "/api/palettes", "/app.js" })
        {
            using var response = await client.GetAsync(path);
            var problem = await Problem.ReadAsync(response, HttpStatusCode.Unauthorized);
            Assert.Contains("Bearer", problem.GetProperty("detail").GetString());
            // RFC 6750 section 3: a 401 to a bearer-protected resource carries WWW-Authenticate: Bearer.
            Assert.StartsWith("Bearer", response.Headers.WwwAuthenticate.ToString());
        }
    }

    [Fact]
    public async Task Healthz_answers_anyone()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings());
        using var client = factory.CreateClient();
        using var response = await client.GetAsync("/healthz");
        Assert.Equal(HttpStatusCode.OK, response.StatusCode);
    }

    [Fact]
    public async Task Each_token_of_the_file_opens_everything_and_a_wrong_one_is_refused_by_name()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings());
        foreach (var token in new[] { AccessFixture.Token, AccessFixture.SecondToken })
        {
            using var client = factory.WithBearer(token);
            var ids = JsonDocument.Parse(await client.GetStringAsync("/api/fields")).RootElement.EnumerateArray().Select(f => f.GetProperty("id").GetString()).ToList();
            // With the token, the private fields are there too.
            Assert.Equal(["hidden", "listed", "open"], ids.Order());
        }
        using var wrong = factory.WithBearer(AccessFixture.Token + "x");
        using var refused = await wrong.GetAsync("/api/fields");
        var problem = await Problem.ReadAsync(refused, HttpStatusCode.Unauthorized);
        Assert.Contains("not an access token", problem.GetProperty("detail").GetString());
        // RFC 6750 section 3.1: a token that was presented and refused is error="invalid_token".
        Assert.Contains("invalid_token", refused.Headers.WwwAuthenticate.ToString());
    }

    [Fact]
    public async Task A_page_request_without_a_token_is_sent_to_the_sign_in_form_and_comes_back_after()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings());
        using var client = factory.Browser();
        using var request = new HttpRequestMessage(HttpMethod.Get, "/?field=open&z=2");
        request.Headers.Accept.ParseAdd("text/html");
        using var response = await client.SendAsync(request);
        Assert.Equal(HttpStatusCode.Redirect, response.StatusCode);
        Assert.Equal("/signin?return=%2F%3Ffield%3Dopen%26z%3D2", response.Headers.Location!.OriginalString);
        var form = await client.GetStringAsync(response.Headers.Location);
        Assert.Contains("<form method=\"post\" action=\"/signin\">", form);
        Assert.Contains("value=\"/?field=open&amp;z=2\"", form);
    }

    [Fact]
    public void The_environment_variable_is_a_token_too_and_bad_token_options_stop_the_start()
    {
        var fromVariable = AccessOptions.FromConfiguration(Config(("MOSAIC_ACCESS_TOKEN", AccessFixture.Token)));
        Assert.NotNull(fromVariable.Tokens.Match(AccessFixture.Token));
        Assert.Null(fromVariable.Tokens.Match(AccessFixture.SecondToken));
        Assert.Equal(AnonymousAccess.None, fromVariable.Anonymous);

        var open = AccessOptions.FromConfiguration(Config());
        Assert.False(open.Tokens.IsConfigured);
        Assert.Equal(AnonymousAccess.PublicFields, open.Anonymous);

        var shortToken = Assert.Throws<AccessOptionException>(() => AccessOptions.FromConfiguration(Config(("MOSAIC_ACCESS_TOKEN", "short"))));
        Assert.Equal("MOSAIC_ACCESS_TOKEN", shortToken.Option);
        var missing = Assert.Throws<AccessOptionException>(() => AccessOptions.FromConfiguration(Config(("access-token-file", Path.Combine(fixture.Root, "none.txt")))));
        Assert.Equal("--access-token-file", missing.Option);
        var empty = Path.Combine(fixture.Root, "empty-tokens.txt");
        File.WriteAllText(empty, "# nothing here\n\n");
        Assert.Contains("holds no token", Assert.Throws<AccessOptionException>(() => AccessOptions.FromConfiguration(Config(("access-token-file", empty)))).Message);
        Assert.Equal("--anonymous", Assert.Throws<AccessOptionException>(() => AccessOptions.FromConfiguration(Config(("anonymous", "none")))).Option);
        Assert.Equal("--allowed-origins", Assert.Throws<AccessOptionException>(() => AccessOptions.FromConfiguration(Config(("allowed-origins", "not an origin")))).Option);
    }

    private static IConfiguration Config(params (string Key, string Value)[] values) =>
        new ConfigurationBuilder().AddInMemoryCollection(values.Select(v => new KeyValuePair<string, string?>(v.Key, v.Value))).Build();
}
