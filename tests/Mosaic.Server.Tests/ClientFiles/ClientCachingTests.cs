using System.Net;
using System.Net.Http.Headers;

namespace Mosaic.Server.Tests.ClientFiles;

/// <summary>
/// The page and the client's files are kept by the browser and revalidated on each visit: Cache-Control no-cache
/// (RFC 9111 5.2.2.4: may be stored, must be validated before use) with a strong ETag, and 304 Not Modified, with no
/// body, to an If-None-Match naming it (RFC 9110 13.1.2 and 15.4.5); a changed or unknown tag gets the whole file.
/// </summary>
public sealed class ClientCachingTests(ClientSiteFixture site) : IClassFixture<ClientSiteFixture>
{
    [Theory]
    [InlineData("/")]
    [InlineData("/index.html")]
    [InlineData("/app.js")]
    [InlineData("/lib/leaflet/leaflet-src.esm.js")]
    [InlineData("/app.css")]
    public async Task A_file_is_revalidated_with_its_strong_etag_and_answers_304_when_unchanged(string path)
    {
        using var first = await site.Client.GetAsync(path);
        Assert.Equal(HttpStatusCode.OK, first.StatusCode);
        Assert.True(first.Headers.CacheControl?.NoCache, $"{path}: Cache-Control is '{first.Headers.CacheControl}'");
        var etag = first.Headers.ETag;
        Assert.NotNull(etag);
        Assert.False(etag.IsWeak, $"{path}: weak ETag {etag}");
        var body = await first.Content.ReadAsByteArrayAsync();
        Assert.NotEmpty(body);

        using var again = new HttpRequestMessage(HttpMethod.Get, path);
        again.Headers.IfNoneMatch.Add(etag);
        using var unchanged = await site.Client.SendAsync(again);
        Assert.Equal(HttpStatusCode.NotModified, unchanged.StatusCode);
        Assert.Empty(await unchanged.Content.ReadAsByteArrayAsync());
        Assert.Equal(etag, unchanged.Headers.ETag);

        using var other = new HttpRequestMessage(HttpMethod.Get, path);
        other.Headers.IfNoneMatch.Add(new EntityTagHeaderValue("\"not-this-one\""));
        using var changed = await site.Client.SendAsync(other);
        Assert.Equal(HttpStatusCode.OK, changed.StatusCode);
        Assert.Equal(body, await changed.Content.ReadAsByteArrayAsync());
    }

    [Fact]
    public async Task The_page_is_html_and_a_HEAD_gets_its_headers_without_the_body()
    {
        using var get = await site.Client.GetAsync("/");
        var length = (await get.Content.ReadAsByteArrayAsync()).Length;
        Assert.Equal("text/html", get.Content.Headers.ContentType?.MediaType);
        Assert.Equal("utf-8", get.Content.Headers.ContentType?.CharSet);
        Assert.Equal(length, get.Content.Headers.ContentLength);

        // RFC 9110 9.3.2: HEAD answers as GET would, without content.
        using var head = await site.Client.SendAsync(new HttpRequestMessage(HttpMethod.Head, "/"));
        Assert.Equal(HttpStatusCode.OK, head.StatusCode);
        Assert.Equal(get.Headers.ETag, head.Headers.ETag);
        Assert.Equal(length, head.Content.Headers.ContentLength);
        Assert.Empty(await head.Content.ReadAsByteArrayAsync());
    }

    [Fact]
    public async Task A_wildcard_If_None_Match_matches_the_page()
    {
        // RFC 9110 13.1.2: "*" matches any current representation.
        using var request = new HttpRequestMessage(HttpMethod.Get, "/");
        request.Headers.TryAddWithoutValidation("If-None-Match", "*");
        using var answer = await site.Client.SendAsync(request);
        Assert.Equal(HttpStatusCode.NotModified, answer.StatusCode);
    }
}
