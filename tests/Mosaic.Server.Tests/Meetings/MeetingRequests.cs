using System.Net.Http.Json;
using System.Text.Json;

namespace Mosaic.Server.Tests.Meetings;

/// <summary>Starting meetings over HTTP, as the page does.</summary>
public static class MeetingRequests
{
    /// <summary>A view state of the "single" field of <see cref="ServerDataFixture"/>, pixel form.</summary>
    public static Dictionary<string, string> State(string x = "300.5", string y = "150.5", string z = "1") =>
        new() { ["field"] = "single", ["hdu"] = "0", ["x"] = x, ["y"] = y, ["z"] = z, ["stretch"] = "asinh" };

    public static async Task<HttpResponseMessage> PostAsync(HttpClient client, object body) =>
        await client.PostAsJsonAsync("/api/meetings", body);

    /// <summary>Starts a meeting showing <paramref name="state"/>; returns its id and presenter key.</summary>
    public static async Task<(string Id, string Key)> StartAsync(HttpClient client, IReadOnlyDictionary<string, string> state)
    {
        using var response = await PostAsync(client, new { state });
        var body = await response.Content.ReadAsStringAsync();
        if ((int)response.StatusCode != 201) throw new InvalidOperationException($"POST /api/meetings answered {(int)response.StatusCode}: {body}");
        var dto = JsonDocument.Parse(body).RootElement;
        return (dto.GetProperty("id").GetString()!, dto.GetProperty("presenterKey").GetString()!);
    }

    public static Dictionary<string, string> ToMap(JsonElement? element) =>
        element!.Value.EnumerateObject().ToDictionary(p => p.Name, p => p.Value.GetString()!);
}
