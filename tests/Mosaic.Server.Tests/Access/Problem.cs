using System.Net;
using System.Text.Json;

namespace Mosaic.Server.Tests.Access;

/// <summary>Reads an RFC 9457 problem-details answer and checks its status and media type.</summary>
public static class Problem
{
    public static async Task<JsonElement> ReadAsync(HttpResponseMessage response, HttpStatusCode status)
    {
        var body = await response.Content.ReadAsStringAsync();
        Assert.True(response.StatusCode == status, $"expected {(int)status}, got {(int)response.StatusCode}: {body}");
        // RFC 9457 section 3: problem details are served as application/problem+json.
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
        var problem = JsonDocument.Parse(body).RootElement;
        Assert.Equal((int)status, problem.GetProperty("status").GetInt32());
        return problem;
    }
}
