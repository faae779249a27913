using System.Net;
using System.Net.Http.Headers;
using System.Net.Http.Json;
using System.Text.Json;

namespace Mosaic.Server.Tests.TileServing;

/// <summary>
/// Tile responses against HTTP's caching rules: RFC 9110 (semantics: ETag 8.8.3, If-None-Match 13.1.2, 304 15.4.5)
/// and RFC 9111 (caching: Cache-Control directives 5.2.2), with RFC 8246 for "immutable". Section numbers from memory.
/// </summary>
public sealed class TileCachingHeaderTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>
{
    private const string Tile = "/tiles/single/1/0/0.png";

    private static async Task<string> VersionAsync(HttpClient client)
    {
        var field = await client.GetFromJsonAsync<JsonElement>("/api/fields/single");
        return field.GetProperty("bands")[0].GetProperty("version").GetString()!;
    }

    private static HttpRequestMessage Conditional(string url, string ifNoneMatch)
    {
        var request = new HttpRequestMessage(HttpMethod.Get, url);
        // Sent as written: the field's syntax (lists, W/, *) is what is under test, not HttpClient's parser.
        Assert.True(request.Headers.TryAddWithoutValidation("If-None-Match", ifNoneMatch));
        return request;
    }

    [Fact]
    public async Task A_versioned_tile_is_immutable_with_a_strong_etag_and_says_which_tier_answered()
    {
        using var factory = new TileServingFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(client, "single");
        var url = $"{Tile}?v={await VersionAsync(client)}";

        var first = await client.GetAsync(url);
        Assert.Equal(HttpStatusCode.OK, first.StatusCode);
        var cache = first.Headers.CacheControl!;
        // RFC 9111 5.2.2.9 public, 5.2.2.1 max-age (one year, in seconds); RFC 8246 section 2 immutable.
        Assert.True(cache.Public);
        Assert.Equal(TimeSpan.FromSeconds(31_536_000), cache.MaxAge);
        Assert.Contains(cache.Extensions, e => e.Name == "immutable");
        // RFC 9110 8.8.3: a strong validator is a quoted opaque tag without the W/ prefix.
        Assert.False(first.Headers.ETag!.IsWeak);
        Assert.Matches("^\"[0-9a-f]+\"$", first.Headers.ETag.Tag);
        Assert.Equal("rendered", Assert.Single(first.Headers.GetValues("X-Tile-Cache")));

        var second = await client.GetAsync(url);
        Assert.Equal("memory", Assert.Single(second.Headers.GetValues("X-Tile-Cache")));
        Assert.Equal(await first.Content.ReadAsByteArrayAsync(), await second.Content.ReadAsByteArrayAsync());
        Assert.Equal(first.Headers.ETag, second.Headers.ETag);
    }

    [Theory]
    [InlineData("{0}", true)]                       // the tag itself
    [InlineData("W/{0}", true)]                     // weak comparison: W/"x" matches "x" (RFC 9110 8.8.3.2, used by 13.1.2)
    [InlineData("\"0000\", {0}", true)]             // a list: any member matching is enough
    [InlineData("\"0000\",W/{0} , \"ffff\"", true)] // list with optional whitespace around the commas
    [InlineData("*", true)]                         // "*" matches any current representation
    [InlineData("\"0000\"", false)]
    [InlineData("W/\"0000\", \"1111\"", false)]
    public async Task If_None_Match_answers_304_with_the_etag_and_cache_control_of_the_200(string field, bool notModified)
    {
        using var factory = new TileServingFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(client, "single");
        var url = $"{Tile}?v={await VersionAsync(client)}";
        var full = await client.GetAsync(url);
        var etag = full.Headers.ETag!.Tag;

        var answer = await client.SendAsync(Conditional(url, string.Format(System.Globalization.CultureInfo.InvariantCulture, field, etag)));
        if (notModified)
        {
            Assert.Equal(HttpStatusCode.NotModified, answer.StatusCode);
            // RFC 9110 15.4.5: a 304 carries the ETag and Cache-Control a 200 would, and no content.
            Assert.Equal(full.Headers.ETag, answer.Headers.ETag);
            Assert.Equal(full.Headers.CacheControl, answer.Headers.CacheControl);
            Assert.Empty(await answer.Content.ReadAsByteArrayAsync());
        }
        else
        {
            Assert.Equal(HttpStatusCode.OK, answer.StatusCode);
            Assert.Equal(await full.Content.ReadAsByteArrayAsync(), await answer.Content.ReadAsByteArrayAsync());
        }
    }

    [Fact]
    public async Task An_unversioned_tile_must_revalidate_and_its_304_says_so_too()
    {
        using var factory = new TileServingFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(client, "single");
        var full = await client.GetAsync(Tile);
        // RFC 9111 5.2.2.4: no-cache lets a cache store the tile but not reuse it without asking again.
        Assert.True(full.Headers.CacheControl!.NoCache);
        Assert.Null(full.Headers.CacheControl.MaxAge);

        var answer = await client.SendAsync(Conditional(Tile, full.Headers.ETag!.ToString()));
        Assert.Equal(HttpStatusCode.NotModified, answer.StatusCode);
        Assert.True(answer.Headers.CacheControl!.NoCache);
        Assert.Equal(full.Headers.ETag, answer.Headers.ETag);
    }

    [Theory]
    [InlineData("/tiles/single/7/0/0.png?v={0}", HttpStatusCode.NotFound)]          // zoom beyond the pyramid
    [InlineData("/tiles/single/1/9/0.png?v={0}", HttpStatusCode.NotFound)]          // column outside the grid
    [InlineData("/tiles/elsewhere/0/0/0.png?v={0}", HttpStatusCode.NotFound)]       // no such field
    [InlineData("/tiles/single/1/0/0.png?v={0}&stretch=wobbly", HttpStatusCode.BadRequest)]
    [InlineData("/tiles/single/1/0/0.png?v={0}&gamma=-2&stretch=power", HttpStatusCode.BadRequest)]
    public async Task Errors_are_never_stored_even_on_a_versioned_url(string template, HttpStatusCode status)
    {
        using var factory = new TileServingFactory(data.DataDirectory, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(client, "single");
        var url = string.Format(System.Globalization.CultureInfo.InvariantCulture, template, await VersionAsync(client));

        var answer = await client.GetAsync(url);
        Assert.Equal(status, answer.StatusCode);
        // RFC 9457 section 3: problem details as application/problem+json.
        Assert.Equal("application/problem+json", answer.Content.Headers.ContentType?.MediaType);
        // RFC 9111 5.2.2.5: no-store, so no cache keeps the error; and nothing of the tile's long-lived policy leaks in.
        Assert.True(answer.Headers.CacheControl?.NoStore, $"Cache-Control: {answer.Headers.CacheControl}");
        Assert.False(answer.Headers.CacheControl!.Public);
        Assert.Null(answer.Headers.CacheControl.MaxAge);
        Assert.Null(answer.Headers.ETag);
    }
}
