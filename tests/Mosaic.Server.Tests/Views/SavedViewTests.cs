using System.Net;
using System.Net.Http.Json;
using System.Security.Cryptography;
using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using Mosaic.Testing;

namespace Mosaic.Server.Tests.Views;

/// <summary>The saved views API (issue 7 contract), with the database read back by an outside SQLite reader.</summary>
public sealed class SavedViewTests(ViewsFixture fixture) : IClassFixture<ViewsFixture>
{
    private static JsonObject State(string field, params (string Key, string Value)[] more)
    {
        var state = new JsonObject { ["v"] = "1", ["field"] = field };
        foreach (var (key, value) in more) state[key] = value;
        return state;
    }

    private async Task<JsonElement> Save(JsonObject state, string? title = null, string? note = null)
    {
        var body = new JsonObject { ["state"] = state };
        if (title is not null) body["title"] = title;
        if (note is not null) body["note"] = note;
        var response = await fixture.Client.PostAsJsonAsync("/api/views", body);
        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        var created = await response.Content.ReadFromJsonAsync<JsonElement>();
        Assert.Equal($"/api/views/{created.GetProperty("id").GetString()}", response.Headers.Location?.OriginalString);
        return created;
    }

    [Fact]
    public async Task SavedViewRoundTripsWithItsStateInOrderAndALinkThatParsesBack()
    {
        var state = State("alpha", ("band", "r"), ("hdu", "canvas"), ("ra", "150.1234567"), ("dec", "-2.3456789"),
            ("z", "3"), ("label", "a b&c=d/é"), ("mk", "p,1,2\nc,3,4,5"));
        var created = await Save(state, "Bright knot", "Look at the\nsouth-east arm.");
        var id = created.GetProperty("id").GetString()!;
        // Contract: id of 10+ URL-safe characters (RFC 4648 section 5 alphabet); deleteKey 128 bits in base64url.
        Assert.True(id.Length >= 10 && id.All(c => char.IsAsciiLetterOrDigit(c) || c is '-' or '_'), id);
        var key = created.GetProperty("deleteKey").GetString()!;
        Assert.Equal(16, Convert.FromBase64String(key.Replace('-', '+').Replace('_', '/') + "==").Length);
        Assert.Equal($"/v/{id}", created.GetProperty("url").GetString());
        Assert.Equal("alpha", created.GetProperty("field").GetString());

        var view = await fixture.Client.GetFromJsonAsync<JsonElement>($"/api/views/{id}");
        Assert.Equal("Bright knot", view.GetProperty("title").GetString());
        Assert.Equal("Look at the\nsouth-east arm.", view.GetProperty("note").GetString());
        Assert.False(view.TryGetProperty("deleteKey", out _));
        Assert.Equal(state.Select(p => (p.Key, p.Value!.GetValue<string>())),
            view.GetProperty("state").EnumerateObject().Select(p => (p.Name, p.Value.GetString()!)));
        // ISO 8601 in UTC (RFC 3339 form with Z), within the last minutes.
        var createdText = view.GetProperty("created").GetString()!;
        Assert.EndsWith("Z", createdText);
        Assert.True(Math.Abs((DateTime.UtcNow - DateTime.Parse(createdText, null, System.Globalization.DateTimeStyles.AdjustToUniversal)).TotalMinutes) < 5);
        Assert.Equal(createdText, created.GetProperty("created").GetString());

        // The link read by Python's urllib.parse.parse_qsl (an outside query-string parser): the same pairs, in
        // order, with the "\n"-joined value as that parameter repeated.
        var link = view.GetProperty("link").GetString()!;
        Assert.StartsWith("/?", link);
        var parsed = DebianPython.RunCode("""
            import json, sys
            from urllib.parse import parse_qsl
            print(json.dumps(parse_qsl(sys.argv[1][2:], keep_blank_values=True, strict_parsing=True)))
            """, [link]);
        var pairs = JsonDocument.Parse(parsed).RootElement.EnumerateArray().Select(p => (p[0].GetString()!, p[1].GetString()!)).ToList();
        var expected = state.SelectMany(p => p.Value!.GetValue<string>().Split('\n').Select(v => (p.Key, v))).ToList();
        Assert.Equal(expected, pairs);
    }

    [Fact]
    public async Task DatabaseIsInWalModeAndHoldsOnlyTheKeysHash()
    {
        var created = await Save(State("beta", ("z", "2")), "for the reader");
        var id = created.GetProperty("id").GetString()!;
        var key = created.GetProperty("deleteKey").GetString()!;
        var database = Path.Combine(fixture.StateDirectory, "views.db");
        Assert.True(File.Exists(database));

        // Python's sqlite3 module (Debian's /usr/bin/python3), an outside reader of the file, and hashlib's SHA-256.
        var output = DebianPython.RunCode("""
            import hashlib, json, sqlite3, sys
            db = sqlite3.connect(sys.argv[1])
            mode = db.execute("PRAGMA journal_mode").fetchone()[0]
            row = db.execute("SELECT field, title, state, key_sha256 FROM views WHERE id = ?", (sys.argv[2],)).fetchone()
            print(json.dumps({"mode": mode, "field": row[0], "title": row[1], "state": json.loads(row[2]),
                              "keyMatches": row[3] == hashlib.sha256(sys.argv[3].encode()).digest(),
                              "keyStored": any(sys.argv[3] in str(v) for v in row)}))
            """, [database, id, key]);
        var r = JsonDocument.Parse(output).RootElement;
        Assert.Equal("wal", r.GetProperty("mode").GetString());
        Assert.Equal("beta", r.GetProperty("field").GetString());
        Assert.Equal("for the reader", r.GetProperty("title").GetString());
        Assert.Equal("2", r.GetProperty("state").GetProperty("z").GetString());
        Assert.True(r.GetProperty("keyMatches").GetBoolean());
        Assert.False(r.GetProperty("keyStored").GetBoolean());
    }

    [Fact]
    public async Task ViewsSurviveARestartOnTheSameStateFolder()
    {
        var id = (await Save(State("alpha", ("x", "5"), ("y", "7")), "kept")).GetProperty("id").GetString()!;
        using (var second = fixture.Start())
        {
            using var client = second.CreateClient();
            var view = await client.GetFromJsonAsync<JsonElement>($"/api/views/{id}");
            Assert.Equal("kept", view.GetProperty("title").GetString());
            Assert.Equal("/?v=1&field=alpha&x=5&y=7", view.GetProperty("link").GetString());
        }
        // And a view saved by the second server is seen by a third.
        string later;
        using (var second = fixture.Start())
        {
            using var client = second.CreateClient();
            var response = await client.PostAsJsonAsync("/api/views", new JsonObject { ["state"] = State("beta") });
            later = (await response.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("id").GetString()!;
        }
        using var third = fixture.Start();
        using var thirdClient = third.CreateClient();
        Assert.Equal(HttpStatusCode.OK, (await thirdClient.GetAsync($"/api/views/{later}")).StatusCode);
        Assert.Equal(HttpStatusCode.OK, (await thirdClient.GetAsync($"/api/views/{id}")).StatusCode);
    }

    [Fact]
    public async Task DeleteNeedsTheRightKey()
    {
        var created = await Save(State("alpha"));
        var id = created.GetProperty("id").GetString()!;
        var key = created.GetProperty("deleteKey").GetString()!;

        var missing = await fixture.Client.DeleteAsync($"/api/views/{id}");
        Assert.Equal(HttpStatusCode.Forbidden, missing.StatusCode);
        Assert.Equal("key", (await missing.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("parameter").GetString());
        var wrongKey = key[..^2] + (key[^2] == 'A' ? "BA" : "AA");
        Assert.Equal(HttpStatusCode.Forbidden, (await fixture.Client.DeleteAsync($"/api/views/{id}?key={wrongKey}")).StatusCode);
        Assert.Equal(HttpStatusCode.OK, (await fixture.Client.GetAsync($"/api/views/{id}")).StatusCode);

        using var request = new HttpRequestMessage(HttpMethod.Delete, $"/api/views/{id}");
        request.Headers.Add("X-Delete-Key", key);
        Assert.Equal(HttpStatusCode.NoContent, (await fixture.Client.SendAsync(request)).StatusCode);
        Assert.Equal(HttpStatusCode.NotFound, (await fixture.Client.GetAsync($"/api/views/{id}")).StatusCode);
        Assert.Equal(HttpStatusCode.NotFound, (await fixture.Client.DeleteAsync($"/api/views/{id}?key={key}")).StatusCode);

        // The query form works as well.
        var other = await Save(State("beta"));
        Assert.Equal(HttpStatusCode.NoContent, (await fixture.Client.DeleteAsync(
            $"/api/views/{other.GetProperty("id").GetString()}?key={other.GetProperty("deleteKey").GetString()}")).StatusCode);
    }

    public static TheoryData<string, int, string> BadBodies()
    {
        var tooMany = new JsonObject { ["field"] = "alpha" };
        for (var i = 0; i < 200; i++) tooMany[$"k{i}"] = "1";
        var tooBig = new JsonObject { ["field"] = "alpha", ["blob"] = new string('x', 17 * 1024) };
        return new TheoryData<string, int, string>
        {
            { """{"state": "field=alpha"}""", 400, "state" },
            { """{"state": ["alpha"]}""", 400, "state" },
            { """{"state": {"field": "alpha", "z": 3}}""", 400, "state.z" },
            { """{"state": {"field": "alpha", "grid": null}}""", 400, "state.grid" },
            { new JsonObject { ["state"] = tooMany }.ToJsonString(), 400, "state" },
            { new JsonObject { ["state"] = tooBig }.ToJsonString(), 400, "state" },
            { new JsonObject { ["state"] = new JsonObject { ["field"] = "alpha" }, ["title"] = new string('t', 201) }.ToJsonString(), 400, "title" },
            { new JsonObject { ["state"] = new JsonObject { ["field"] = "alpha" }, ["note"] = new string('n', 4001) }.ToJsonString(), 400, "note" },
            { """{"state": {"field": "alpha"}, "title": 5}""", 400, "title" },
            { """{"state": {"v": "2", "field": "alpha"}}""", 400, "state.v" },
            { """{"state": {"v": "1"}}""", 400, "state.field" },
            { """{"state": {"v": "1", "field": "gamma"}}""", 422, "state.field" },
            { """{"title": "no state"}""", 400, "state" },
            { """{"state": {"field": "alpha"}, "owner": "me"}""", 400, "owner" },
            { """{"state": {"field": "alpha"}""", 400, "body" },
            { """[1, 2]""", 400, "body" },
        };
    }

    [Theory]
    [MemberData(nameof(BadBodies))]
    public async Task BadInputIsRefusedNamingThePart(string body, int status, string part)
    {
        using var content = new StringContent(body, Encoding.UTF8, "application/json");
        var response = await fixture.Client.PostAsync("/api/views", content);
        Assert.Equal(status, (int)response.StatusCode);
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
        var problem = await response.Content.ReadFromJsonAsync<JsonElement>();
        Assert.Equal(part, problem.GetProperty("parameter").GetString());
        Assert.Contains(part.Split('.')[^1], problem.GetProperty("detail").GetString());
    }

    [Fact]
    public async Task LimitsAreInclusive()
    {
        // Exactly 200 keys, 200 title characters and 4000 note characters are accepted (contract: "≤").
        var state = new JsonObject { ["field"] = "alpha" };
        for (var i = 1; i < 200; i++) state[$"k{i}"] = "1";
        await Save(state, new string('t', 200), new string('n', 4000));
    }

    [Fact]
    public async Task ListingIsPerFieldNewestFirst()
    {
        using var isolated = new ViewsFixture();
        async Task<string> SaveTo(string field, string title)
        {
            var response = await isolated.Client.PostAsJsonAsync("/api/views", new JsonObject { ["state"] = State(field), ["title"] = title });
            return (await response.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("id").GetString()!;
        }
        var first = await SaveTo("alpha", "one");
        await Task.Delay(5);
        var other = await SaveTo("beta", "elsewhere");
        await Task.Delay(5);
        var second = await SaveTo("alpha", "two");
        await Task.Delay(5);
        var third = await SaveTo("alpha", "three");

        var list = await isolated.Client.GetFromJsonAsync<JsonElement>("/api/views?field=alpha");
        var rows = list.EnumerateArray().ToList();
        Assert.Equal([third, second, first], rows.Select(r => r.GetProperty("id").GetString()));
        Assert.All(rows, r => Assert.Equal("alpha", r.GetProperty("field").GetString()));
        Assert.All(rows, r => Assert.False(r.TryGetProperty("state", out _)));
        Assert.All(rows, r => Assert.Equal("/?v=1&field=alpha", r.GetProperty("link").GetString()));
        var times = rows.Select(r => DateTime.Parse(r.GetProperty("created").GetString()!, null, System.Globalization.DateTimeStyles.AdjustToUniversal)).ToList();
        Assert.Equal(times.OrderByDescending(t => t), times);

        var beta = await isolated.Client.GetFromJsonAsync<JsonElement>("/api/views?field=beta");
        Assert.Equal([other], beta.EnumerateArray().Select(r => r.GetProperty("id").GetString()));
        var none = await isolated.Client.GetAsync("/api/views");
        Assert.Equal(HttpStatusCode.BadRequest, none.StatusCode);
        Assert.Equal("field", (await none.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("parameter").GetString());
    }

    [Fact]
    public async Task ConcurrentSavesAllLand()
    {
        using var isolated = new ViewsFixture();
        var saves = Enumerable.Range(0, 24).Select(async i =>
        {
            var response = await isolated.Client.PostAsJsonAsync("/api/views", new JsonObject { ["state"] = State("beta", ("z", i.ToString(System.Globalization.CultureInfo.InvariantCulture))) });
            Assert.Equal(HttpStatusCode.Created, response.StatusCode);
            return (await response.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("id").GetString()!;
        }).ToList();
        var ids = await Task.WhenAll(saves);
        Assert.Equal(24, ids.Distinct().Count());
        var list = await isolated.Client.GetFromJsonAsync<JsonElement>("/api/views?field=beta");
        Assert.Equal(ids.OrderBy(i => i), list.EnumerateArray().Select(r => r.GetProperty("id").GetString()!).OrderBy(i => i));
    }

    [Fact]
    public async Task ShortAddressRedirectsToTheLink()
    {
        var id = (await Save(State("alpha", ("z", "4")))).GetProperty("id").GetString()!;
        using var client = fixture.Factory.CreateClientWithoutRedirects();
        var response = await client.GetAsync($"/v/{id}");
        Assert.Equal(HttpStatusCode.Redirect, response.StatusCode);
        Assert.Equal("/?v=1&field=alpha&z=4", response.Headers.Location?.OriginalString);

        var page = await client.GetAsync("/v/AAAAAAAAAAAA");
        Assert.Equal(HttpStatusCode.NotFound, page.StatusCode);
        Assert.Equal("text/html", page.Content.Headers.ContentType?.MediaType);
        Assert.Contains("AAAAAAAAAAAA", await page.Content.ReadAsStringAsync());

        using var asJson = new HttpRequestMessage(HttpMethod.Get, "/v/AAAAAAAAAAAA");
        asJson.Headers.Accept.ParseAdd("application/json");
        var problem = await client.SendAsync(asJson);
        Assert.Equal(HttpStatusCode.NotFound, problem.StatusCode);
        Assert.Equal("application/problem+json", problem.Content.Headers.ContentType?.MediaType);
        Assert.Equal(HttpStatusCode.NotFound, (await client.GetAsync("/api/views/nope")).StatusCode);
    }

    [Fact]
    public void DeleteKeyIsStoredAsSha256()
    {
        // FIPS 180-4 test vector for SHA-256("abc"), so the stored hash is the standard function.
        Assert.Equal("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad",
            Convert.ToHexStringLower(Mosaic.Server.Views.ViewTokens.Hash("abc")));
    }
}
