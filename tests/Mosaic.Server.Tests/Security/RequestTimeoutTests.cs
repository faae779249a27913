using System.Net;
using System.Text.Json;

namespace Mosaic.Server.Tests.Security;

/// <summary>A render that runs past the timeout is stopped and answered 504 Gateway Timeout (RFC 9110 15.6.5) with problem details.</summary>
public sealed class RequestTimeoutTests(TimeoutFixture data) : IClassFixture<TimeoutFixture>
{
    [Fact]
    public async Task A_render_past_the_timeout_is_a_504_problem_and_a_cheap_request_is_not_held_to_it()
    {
        await MosaicFactory.WaitForPyramidsAsync(data.Client, TimeoutFixture.BigField, TimeSpan.FromMinutes(2));
        // 4 megapixels take far longer than 5 ms to read, map and encode (common practice: tens of ms at best on a fast core).
        using var response = await data.Client.GetAsync($"/api/fields/{TimeoutFixture.BigField}/render.png?x0=1&y0=1&x1=2000&y1=2000&stretch=linear");
        var text = await response.Content.ReadAsStringAsync();
        Assert.True(response.StatusCode == HttpStatusCode.GatewayTimeout, $"gave {(int)response.StatusCode}: {text[..Math.Min(200, text.Length)]}");
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
        using var problem = JsonDocument.Parse(text);
        Assert.Equal(504, problem.RootElement.GetProperty("status").GetInt32());

        // The probe has no timeout policy: it answers whatever the render timeout.
        Assert.Equal(HttpStatusCode.OK, (await data.Client.GetAsync($"/api/fields/{TimeoutFixture.BigField}/probe?x=1000&y=1000")).StatusCode);
    }
}
