using System.Buffers.Text;
using System.Net;
using System.Text.Json;
using Mosaic.Server.Meetings;

namespace Mosaic.Server.Tests.Meetings;

public sealed class MeetingStartTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>
{
    [Fact]
    public async Task Starting_a_meeting_answers_201_with_a_join_link_and_a_128_bit_url_safe_presenter_key()
    {
        await using var factory = new MeetingFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        using var response = await MeetingRequests.PostAsync(client, new { state = MeetingRequests.State() });

        Assert.Equal(HttpStatusCode.Created, response.StatusCode);
        var dto = JsonDocument.Parse(await response.Content.ReadAsStringAsync()).RootElement;
        var id = dto.GetProperty("id").GetString()!;
        var key = dto.GetProperty("presenterKey").GetString()!;
        // The join link and its form: issue 7 contract ("/?meeting={id}").
        Assert.Equal($"/?meeting={id}", dto.GetProperty("joinUrl").GetString());
        Assert.Equal($"/?meeting={id}", response.Headers.Location?.OriginalString);
        // RFC 4648 section 5: the base64url alphabet is A-Z a-z 0-9 - _, and unpadded 128 bits are 22 characters.
        Assert.Matches("^[A-Za-z0-9_-]{8,}$", id);
        Assert.Matches("^[A-Za-z0-9_-]{22}$", key);
        Assert.Equal(16, Base64Url.DecodeFromChars(key).Length);
    }

    [Fact]
    public async Task Two_meetings_get_different_ids_and_keys()
    {
        await using var factory = new MeetingFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        var first = await MeetingRequests.StartAsync(client, MeetingRequests.State());
        var second = await MeetingRequests.StartAsync(client, MeetingRequests.State());
        Assert.NotEqual(first.Id, second.Id);
        Assert.NotEqual(first.Key, second.Key);
    }

    public static TheoryData<string, int, string> BadBodies => new()
    {
        // Problem details name the member at fault (RFC 9457 extension member; issue 7 contract for the status codes).
        { """{"state": [1, 2]}""", 400, "state" },
        { """{"state": "field=single"}""", 400, "state" },
        { """{"view": {"field": "single"}}""", 400, "state" },
        { """{"state": {"field": "single", "z": 3}}""", 400, "state.z" },
        { """{"state": {"field": "single", "v": "2"}}""", 400, "state.v" },
        { """{"state": {"x": "1", "y": "2"}}""", 400, "state.field" },
        { """{"state": {"field": "no-such-field"}}""", 422, "state.field" },
    };

    [Theory]
    [MemberData(nameof(BadBodies))]
    public async Task A_bad_start_request_is_a_problem_naming_the_member_at_fault(string body, int status, string parameter)
    {
        await using var factory = new MeetingFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        using var content = new StringContent(body, System.Text.Encoding.UTF8, "application/json");
        using var response = await client.PostAsync("/api/meetings", content);

        Assert.Equal(status, (int)response.StatusCode);
        // RFC 9457 section 3: problem details travel as application/problem+json with the status repeated inside.
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
        var problem = JsonDocument.Parse(await response.Content.ReadAsStringAsync()).RootElement;
        Assert.Equal(status, problem.GetProperty("status").GetInt32());
        Assert.Equal(parameter, problem.GetProperty("parameter").GetString());
    }

    [Fact]
    public async Task A_state_of_more_than_200_parameters_or_16_KiB_is_refused()
    {
        await using var factory = new MeetingFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        var many = MeetingRequests.State();
        for (var i = 0; many.Count <= 200; i++) many[$"p{i}"] = "1";
        using var tooMany = await MeetingRequests.PostAsync(client, new { state = many });
        Assert.Equal(HttpStatusCode.BadRequest, tooMany.StatusCode);
        Assert.Contains("200", await tooMany.Content.ReadAsStringAsync());

        var large = MeetingRequests.State();
        large["note"] = new string('a', 16 * 1024);
        using var tooLarge = await MeetingRequests.PostAsync(client, new { state = large });
        Assert.Equal(HttpStatusCode.BadRequest, tooLarge.StatusCode);
        Assert.Contains("16 KiB", await tooLarge.Content.ReadAsStringAsync());

        // Just inside both bounds is accepted (the same bounds as a saved view's, issue 7 contract).
        var fits = MeetingRequests.State();
        for (var i = 0; fits.Count < 200; i++) fits[$"p{i}"] = "1";
        using var accepted = await MeetingRequests.PostAsync(client, new { state = fits });
        Assert.Equal(HttpStatusCode.Created, accepted.StatusCode);
    }

    [Fact]
    public void Keys_are_kept_as_their_SHA_256()
    {
        // FIPS 180-4 appendix example (one-block message "abc"), via the published SHA-256 test vector.
        Assert.Equal("ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad", Convert.ToHexStringLower(MeetingSecrets.Hash("abc")));
        var key = MeetingSecrets.NewKey();
        var hash = MeetingSecrets.Hash(key);
        Assert.True(MeetingSecrets.Matches(key, hash));
        Assert.False(MeetingSecrets.Matches(key[..^1] + (key[^1] == 'A' ? 'B' : 'A'), hash));
        Assert.False(MeetingSecrets.Matches(null, hash));
    }
}
