using System.Buffers.Binary;
using System.Collections.Concurrent;
using System.Net;
using System.Net.Http.Json;
using System.Text.Json;

namespace Mosaic.Server.Tests;

/// <summary>
/// Files replaced, cut short and deleted under the running server: the server stays up, that field's requests
/// either answer from the new file or fail with problem details naming it, and every other field answers 200.
/// The data are astropy's (ServerDataFixture); expected pixel values follow FITS 4.0 section 5.3.
/// </summary>
public sealed class ServedFileFaultTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>
{
    private const string Probe = "probe?x=333&y=150";

    /// <summary>A fresh data folder with victim.fits and bystander.fits, both copies of single.fits.</summary>
    private (string Folder, string Victim, byte[] Original) NewFolder()
    {
        var folder = Path.Combine(data.Root, $"faults-{Guid.NewGuid():N}");
        Directory.CreateDirectory(folder);
        var original = File.ReadAllBytes(Path.Combine(data.DataDirectory, "single.fits"));
        var victim = Path.Combine(folder, "victim.fits");
        File.WriteAllBytes(victim, original);
        File.WriteAllBytes(Path.Combine(folder, "bystander.fits"), original);
        return (folder, victim, original);
    }

    /// <summary>Writes the new content next to the file and renames it over, as a copy tool or a camera writer does.</summary>
    private static void ReplaceAtomically(string path, byte[] content)
    {
        var staging = path + ".incoming";
        File.WriteAllBytes(staging, content);
        File.SetLastWriteTimeUtc(staging, DateTime.UtcNow.AddSeconds(10));
        File.Move(staging, path, overwrite: true);
    }

    private static Task WaitForRescan() => Task.Delay(1100); // the catalog looks at the folder at most once a second

    private double SingleReference => data.Reference.RootElement.GetProperty("single").GetProperty("333,150").GetDouble();

    private async Task AssertBystanderServes(HttpClient client)
    {
        var probe = await client.GetAsync($"/api/fields/bystander/{Probe}");
        Assert.Equal(HttpStatusCode.OK, probe.StatusCode);
        Assert.Equal(SingleReference, (await probe.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("value").GetDouble());
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync("/tiles/bystander/0/0/0.png")).StatusCode);
    }

    private static async Task AssertProblem(HttpResponseMessage response, params string[] detailParts)
    {
        Assert.Equal(HttpStatusCode.UnprocessableEntity, response.StatusCode);
        Assert.Equal("application/problem+json", response.Content.Headers.ContentType?.MediaType);
        var problem = await response.Content.ReadFromJsonAsync<JsonElement>();
        var detail = problem.GetProperty("detail").GetString()!;
        Assert.Contains("victim.fits", detail);
        foreach (var part in detailParts) Assert.Contains(part, detail, StringComparison.OrdinalIgnoreCase);
    }

    [Fact]
    public async Task A_file_replaced_by_another_image_is_served_from_the_new_file()
    {
        var (folder, victim, original) = NewFolder();
        using var factory = new MosaicFactory(folder, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        var before = await client.GetFromJsonAsync<JsonElement>($"/api/fields/victim/{Probe}");
        Assert.Equal(SingleReference, before.GetProperty("value").GetDouble());

        // Same header, every stored 16-bit sample set to 1000: physical = BZERO + BSCALE x stored = 10 + 0.5 x 1000
        // (section 5.3; single.fits has BZERO = 10, BSCALE = 0.5 as written by astropy).
        var replaced = (byte[])original.Clone();
        var dataStart = replaced.Length - 2880 * ((600 * 300 * 2 + 2879) / 2880);
        for (var i = 0; i < 600 * 300; i++) BinaryPrimitives.WriteInt16BigEndian(replaced.AsSpan(dataStart + 2 * i), 1000);
        ReplaceAtomically(victim, replaced);
        await WaitForRescan();

        var after = await client.GetAsync($"/api/fields/victim/{Probe}");
        Assert.Equal(HttpStatusCode.OK, after.StatusCode);
        Assert.Equal(510.0, (await after.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("value").GetDouble());
        await AssertBystanderServes(client);
    }

    [Fact]
    public async Task A_file_replaced_by_something_that_is_not_fits_fails_clearly()
    {
        var (folder, victim, _) = NewFolder();
        using var factory = new MosaicFactory(folder, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync($"/api/fields/victim/{Probe}")).StatusCode);

        ReplaceAtomically(victim, System.Text.Encoding.ASCII.GetBytes(string.Concat(Enumerable.Repeat("a spreadsheet export\n", 500))));
        await WaitForRescan();

        // FITS 4.0 section 4.4.1.1: a FITS file starts with SIMPLE = T; the reader's error reaches the client whole.
        await AssertProblem(await client.GetAsync($"/api/fields/victim/{Probe}"), "HDU 0, keyword SIMPLE", "not a FITS file");
        var listed = (await client.GetFromJsonAsync<JsonElement>("/api/fields")).EnumerateArray()
            .Single(f => f.GetProperty("id").GetString() == "victim");
        Assert.Contains("not a FITS file", listed.GetProperty("error").GetString(), StringComparison.OrdinalIgnoreCase);
        await AssertBystanderServes(client);
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync("/healthz")).StatusCode);
    }

    [Fact]
    public async Task A_file_cut_inside_its_header_fails_clearly()
    {
        var (folder, victim, _) = NewFolder();
        using var factory = new MosaicFactory(folder, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync($"/api/fields/victim/{Probe}")).StatusCode);

        // Section 3.1: a header is whole 2880-byte blocks; 1,000 bytes is part of the first.
        await using (var stream = new FileStream(victim, FileMode.Open, FileAccess.Write, FileShare.ReadWrite))
            stream.SetLength(1000);
        await WaitForRescan();

        await AssertProblem(await client.GetAsync($"/api/fields/victim/{Probe}"), "HDU 0, keyword END", "truncated header");
        await AssertBystanderServes(client);
    }

    [Fact]
    public async Task Changes_under_a_stream_of_requests_never_give_a_server_error()
    {
        var (folder, victim, original) = NewFolder();
        using var factory = new MosaicFactory(folder, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(client, "victim");
        await MosaicFactory.WaitForPyramidsAsync(client, "bystander");

        var victimCodes = new ConcurrentBag<HttpStatusCode>();
        var bystanderCodes = new ConcurrentBag<HttpStatusCode>();
        using var stop = new CancellationTokenSource();
        async Task Hammer(string field, ConcurrentBag<HttpStatusCode> codes)
        {
            var paths = new[] { $"/api/fields/{field}/{Probe}", $"/tiles/{field}/0/0/0.png", $"/api/fields/{field}/probe?x=5&y=295" };
            for (var i = 0; !stop.IsCancellationRequested; i++)
            {
                using var response = await client.GetAsync(paths[i % paths.Length]);
                codes.Add(response.StatusCode);
            }
        }
        var workers = new[] { Hammer("victim", victimCodes), Hammer("victim", victimCodes), Hammer("bystander", bystanderCodes) };

        // Cut the data, put it back, replace it with junk, delete it: each change lands while requests are in flight.
        await using (var stream = new FileStream(victim, FileMode.Open, FileAccess.Write, FileShare.ReadWrite))
            stream.SetLength(2880 * 3);
        await WaitForRescan();
        ReplaceAtomically(victim, original);
        await WaitForRescan();
        ReplaceAtomically(victim, new byte[5000]);
        await WaitForRescan();
        File.Delete(victim);
        await WaitForRescan();
        await stop.CancelAsync();
        await Task.WhenAll(workers);

        // 200 before and between changes, 422 (problem details) while broken, 404 once deleted; 503 while a new
        // version's pyramid is still building. Never another code, and above all no 500.
        Assert.NotEmpty(victimCodes);
        Assert.All(victimCodes, c => Assert.Contains(c, new[] { HttpStatusCode.OK, HttpStatusCode.UnprocessableEntity, HttpStatusCode.NotFound, HttpStatusCode.ServiceUnavailable }));
        Assert.Contains(HttpStatusCode.UnprocessableEntity, victimCodes);
        Assert.Contains(HttpStatusCode.NotFound, victimCodes);
        Assert.NotEmpty(bystanderCodes);
        Assert.All(bystanderCodes, c => Assert.Equal(HttpStatusCode.OK, c));
        await AssertBystanderServes(client);
    }
}
