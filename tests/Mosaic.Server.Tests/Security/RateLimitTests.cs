using System.Globalization;
using System.Net;
using System.Text.Json;

namespace Mosaic.Server.Tests.Security;

/// <summary>
/// The expensive endpoints are rate limited per client address: past the burst the answer is 429 Too Many Requests
/// (RFC 6585 section 4) with Retry-After in delay-seconds (RFC 9110 section 10.2.3) and problem details (RFC 9457);
/// cheap endpoints and other clients are not held back.
/// </summary>
public sealed class RateLimitTests(TightLimitsFixture data) : IClassFixture<TightLimitsFixture>
{
    private const string Histogram = "/api/fields/open/histogram?lo=0&hi=5000&bins=8";

    [Fact]
    public async Task Past_the_burst_one_client_gets_429_with_retry_after_while_cheap_requests_and_other_clients_pass()
    {
        var local = IPAddress.Parse("127.0.0.1");
        var statuses = new List<int>();
        RawHttp.Answer? refused = null;
        // Sent back to back, well inside one second: the bucket holds Burst tokens and gains one a second.
        for (var i = 0; i < TightLimitsFixture.Burst + 3; i++)
        {
            var answer = await RawHttp.SendAsync(data.Port, Histogram, from: local);
            statuses.Add(answer.Status);
            if (answer.Status == 429) refused ??= answer;
        }
        Assert.All(statuses.Take(TightLimitsFixture.Burst), s => Assert.NotEqual(429, s));
        Assert.Contains(429, statuses.Skip(TightLimitsFixture.Burst));
        Assert.NotNull(refused);

        Assert.True(int.TryParse(refused.Headers["Retry-After"], NumberStyles.None, CultureInfo.InvariantCulture, out var seconds), refused.Raw);
        Assert.InRange(seconds, 1, 60);
        Assert.StartsWith("application/problem+json", refused.Headers["Content-Type"], StringComparison.Ordinal);
        using (var problem = JsonDocument.Parse(refused.Body))
            Assert.Equal(429, problem.RootElement.GetProperty("status").GetInt32());

        // While that client is held back: cheap requests from it pass, and so do expensive ones from another address.
        Assert.Equal(200, (await RawHttp.SendAsync(data.Port, "/healthz", from: local)).Status);
        Assert.Equal(200, (await RawHttp.SendAsync(data.Port, "/api/fields/open/probe?x=1&y=1", from: local)).Status);
        Assert.Equal(200, (await RawHttp.SendAsync(data.Port, "/api/fields/open/stats", from: local)).Status);
        var other = await RawHttp.SendAsync(data.Port, Histogram, from: IPAddress.Parse("127.0.0.2"));
        Assert.NotEqual(429, other.Status);
    }

    [Fact]
    public async Task Every_expensive_endpoint_is_limited()
    {
        string[] urls =
        [
            "/api/fields/open/render.png?x0=1&y0=1&x1=4&y1=4",
            "/api/fields/open/cutout.fits?x0=1&y0=1&x1=4&y1=4",
            "/api/fields/open/stats?x0=1&y0=1&x1=4&y1=4",
            Histogram,
        ];
        // Each from its own address, so one endpoint's tokens do not hide another's limit.
        for (var k = 0; k < urls.Length; k++)
        {
            var from = IPAddress.Parse($"127.0.1.{k + 1}");
            var statuses = new List<int>();
            for (var i = 0; i < TightLimitsFixture.Burst + 3; i++) statuses.Add((await RawHttp.SendAsync(data.Port, urls[k], from: from)).Status);
            Assert.True(statuses.Contains(429), $"{urls[k]} gave {string.Join(", ", statuses)}");
        }
    }
}
