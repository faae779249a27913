using System.Net.Http.Json;
using System.Text.Json;
using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Mvc.Testing;

namespace Mosaic.Server.Tests;

/// <summary>The real server in memory, on a given data and cache folder.</summary>
public sealed class MosaicFactory(string dataDirectory, string cacheDirectory) : WebApplicationFactory<Program>
{
    protected override void ConfigureWebHost(IWebHostBuilder builder)
    {
        builder.UseSetting("data", dataDirectory);
        builder.UseSetting("cache", cacheDirectory);
    }

    /// <summary>Polls the field until every HDU of every readable band reports a ready pyramid.</summary>
    public static async Task WaitForPyramidsAsync(HttpClient client, string field, TimeSpan? timeout = null)
    {
        var deadline = DateTime.UtcNow + (timeout ?? TimeSpan.FromSeconds(60));
        while (true)
        {
            var doc = await client.GetFromJsonAsync<JsonElement>($"/api/fields/{field}");
            var states = doc.GetProperty("bands").EnumerateArray()
                .SelectMany(b => b.GetProperty("hdus").EnumerateArray())
                .Select(h => h.GetProperty("pyramid").GetProperty("state").GetString()).ToList();
            if (states.Count > 0 && states.All(s => s == "ready")) return;
            if (states.Contains("failed")) throw new InvalidOperationException($"a pyramid of {field} failed: {doc}");
            if (DateTime.UtcNow > deadline) throw new TimeoutException($"pyramids of {field} not ready: {doc}");
            await Task.Delay(50);
        }
    }
}
