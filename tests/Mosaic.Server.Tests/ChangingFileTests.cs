using System.Net;
using System.Net.Http.Json;
using System.Text.Json;

namespace Mosaic.Server.Tests;

/// <summary>Files truncated, restored and deleted under the running server: that field fails clearly, the rest serve on.</summary>
public sealed class ChangingFileTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>
{
    [Fact]
    public async Task A_file_truncated_while_served_fails_clearly_and_recovers_when_restored()
    {
        var dataDir = Path.Combine(data.Root, $"changing-{Guid.NewGuid():N}");
        Directory.CreateDirectory(dataDir);
        var victim = Path.Combine(dataDir, "victim.fits");
        var original = await File.ReadAllBytesAsync(Path.Combine(data.DataDirectory, "single.fits"));
        await File.WriteAllBytesAsync(victim, original);
        File.Copy(Path.Combine(data.DataDirectory, "single.fits"), Path.Combine(dataDir, "bystander.fits"));

        using var factory = new MosaicFactory(dataDir, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(client, "victim");
        var before = await client.GetFromJsonAsync<JsonElement>("/api/fields/victim/probe?x=333&y=150");

        // Cut the data short: the header stays readable, the pixels do not (FITS 4.0 section 3.3.2: data fills whole blocks).
        await using (var stream = new FileStream(victim, FileMode.Open, FileAccess.Write, FileShare.ReadWrite))
            stream.SetLength(2880 * 2);
        await Task.Delay(1100); // the catalog looks at the folder again at most once a second

        var broken = await client.GetAsync("/api/fields/victim/probe?x=333&y=150");
        Assert.Equal(HttpStatusCode.UnprocessableEntity, broken.StatusCode);
        var problem = await broken.Content.ReadFromJsonAsync<JsonElement>();
        Assert.Contains("victim.fits", problem.GetProperty("detail").GetString());
        var listed = (await client.GetFromJsonAsync<JsonElement>("/api/fields")).EnumerateArray()
            .Single(f => f.GetProperty("id").GetString() == "victim");
        Assert.Contains("truncated", listed.GetProperty("error").GetString(), StringComparison.OrdinalIgnoreCase);

        var bystander = await client.GetAsync("/api/fields/bystander/probe?x=333&y=150");
        Assert.Equal(HttpStatusCode.OK, bystander.StatusCode);
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync("/tiles/bystander/0/0/0.png")).StatusCode);

        // Put the file back: a new version, served again with the same pixels.
        await File.WriteAllBytesAsync(victim, original);
        File.SetLastWriteTimeUtc(victim, DateTime.UtcNow.AddSeconds(10));
        await Task.Delay(1100);
        var after = await client.GetFromJsonAsync<JsonElement>("/api/fields/victim/probe?x=333&y=150");
        Assert.Equal(before.GetProperty("value").GetDouble(), after.GetProperty("value").GetDouble());
    }

    [Fact]
    public async Task A_deleted_file_is_no_longer_a_field()
    {
        var dataDir = Path.Combine(data.Root, $"deleting-{Guid.NewGuid():N}");
        Directory.CreateDirectory(dataDir);
        var doomed = Path.Combine(dataDir, "doomed.fits");
        File.Copy(Path.Combine(data.DataDirectory, "single.fits"), doomed);

        using var factory = new MosaicFactory(dataDir, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync("/api/fields/doomed/probe?x=1&y=1")).StatusCode);
        File.Delete(doomed);
        await Task.Delay(1100);
        var gone = await client.GetAsync("/api/fields/doomed/probe?x=1&y=1");
        Assert.Equal(HttpStatusCode.NotFound, gone.StatusCode);
        Assert.Equal("field", (await gone.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("parameter").GetString());
    }
}
