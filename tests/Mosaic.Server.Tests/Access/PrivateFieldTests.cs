using System.Net;
using System.Net.Http.Json;
using System.Text.Json;

namespace Mosaic.Server.Tests.Access;

/// <summary>A private field (marker file or --private-fields) does not exist for a caller without the access token: not listed, 404 everywhere.</summary>
public sealed class PrivateFieldTests(AccessFixture fixture) : IClassFixture<AccessFixture>
{
    [Fact]
    public async Task Without_any_token_configured_the_server_stays_open_but_private_fields_are_hidden()
    {
        using var factory = new AccessFactory(fixture, new Dictionary<string, string> { ["private-fields"] = "listed" });
        using var client = factory.CreateClient();
        var ids = await ListAsync(client);
        Assert.Equal(["open"], ids);
        using var open = await client.GetAsync("/api/fields/open");
        Assert.Equal(HttpStatusCode.OK, open.StatusCode);
        await AssertAbsentLikeAMissingFieldAsync(client, "hidden");
        await AssertAbsentLikeAMissingFieldAsync(client, "listed");
    }

    [Fact]
    public async Task With_public_anonymous_access_the_token_holder_sees_private_fields_and_others_do_not()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings(("anonymous", "public")));
        using var anonymous = factory.CreateClient();
        Assert.Equal(["open"], await ListAsync(anonymous));
        await AssertAbsentLikeAMissingFieldAsync(anonymous, "hidden");

        using var holder = factory.WithBearer(AccessFixture.Token);
        Assert.Equal(["hidden", "listed", "open"], (await ListAsync(holder)).Order());
        using var hidden = await holder.GetAsync("/api/fields/hidden/probe?x=3&y=4");
        Assert.Equal(HttpStatusCode.OK, hidden.StatusCode);
    }

    [Fact]
    public async Task Saved_views_of_a_private_field_are_not_there_for_a_public_caller()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings(("anonymous", "public")));
        using var holder = factory.WithBearer(AccessFixture.Token);
        using var saved = await holder.PostAsJsonAsync("/api/views", new { state = new Dictionary<string, string> { ["field"] = "hidden", ["z"] = "1" } });
        Assert.Equal(HttpStatusCode.Created, saved.StatusCode);
        var id = JsonDocument.Parse(await saved.Content.ReadAsStringAsync()).RootElement.GetProperty("id").GetString()!;
        Assert.Equal(1, JsonDocument.Parse(await holder.GetStringAsync("/api/views?field=hidden")).RootElement.GetArrayLength());

        using var anonymous = factory.CreateClient();
        // A field with no views lists [] (the same answer as for a field that does not exist).
        Assert.Equal("[]", await anonymous.GetStringAsync("/api/views?field=hidden"));
        using var view = await anonymous.GetAsync($"/api/views/{id}");
        var problem = await Problem.ReadAsync(view, HttpStatusCode.NotFound);
        Assert.Equal($"There is no saved view '{id}'.", problem.GetProperty("detail").GetString());
    }

    [Fact]
    public async Task A_private_field_named_in_a_body_is_refused_as_a_field_that_does_not_exist()
    {
        using var factory = new AccessFactory(fixture, fixture.TokenSettings(("anonymous", "public")));
        using var anonymous = factory.CreateClient();
        foreach (var path in new[] { "/api/views", "/api/meetings" })
        {
            using var hidden = await anonymous.PostAsJsonAsync(path, new { state = new Dictionary<string, string> { ["field"] = "hidden", ["z"] = "1" } });
            using var missing = await anonymous.PostAsJsonAsync(path, new { state = new Dictionary<string, string> { ["field"] = "never-there", ["z"] = "1" } });
            var a = await Problem.ReadAsync(hidden, HttpStatusCode.UnprocessableEntity);
            var b = await Problem.ReadAsync(missing, HttpStatusCode.UnprocessableEntity);
            Assert.Equal(b.GetProperty("detail").GetString()!.Replace("never-there", "hidden"), a.GetProperty("detail").GetString());
        }
        using var holder = factory.WithBearer(AccessFixture.Token);
        using var saved = await holder.PostAsJsonAsync("/api/views", new { state = new Dictionary<string, string> { ["field"] = "listed", ["z"] = "1" } });
        Assert.Equal(HttpStatusCode.Created, saved.StatusCode);
    }

    private static async Task<List<string>> ListAsync(HttpClient client) =>
        JsonDocument.Parse(await client.GetStringAsync("/api/fields")).RootElement.EnumerateArray().Select(f => f.GetProperty("id").GetString()!).ToList();

    /// <summary>The answer for the hidden field must read exactly as the one for a name that was never there.</summary>
    private static async Task AssertAbsentLikeAMissingFieldAsync(HttpClient client, string field)
    {
        foreach (var suffix in new[] { "", "/probe?x=1&y=1", "/sky" })
        {
            using var hidden = await client.GetAsync($"/api/fields/{field}{suffix}");
            using var missing = await client.GetAsync($"/api/fields/never-there{suffix}");
            var a = await Problem.ReadAsync(hidden, HttpStatusCode.NotFound);
            var b = await Problem.ReadAsync(missing, HttpStatusCode.NotFound);
            Assert.Equal(b.GetProperty("title").GetString(), a.GetProperty("title").GetString());
            Assert.Equal(b.GetProperty("detail").GetString()!.Replace("never-there", field), a.GetProperty("detail").GetString());
        }
        using var tile = await client.GetAsync($"/tiles/{field}/0/0/0.png");
        using var missingTile = await client.GetAsync("/tiles/never-there/0/0/0.png");
        Assert.Equal(HttpStatusCode.NotFound, tile.StatusCode);
        Assert.Equal(missingTile.StatusCode, tile.StatusCode);
    }
}
