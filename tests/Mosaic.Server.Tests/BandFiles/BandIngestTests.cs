using System.Text.Json;
using Mosaic.Server.Hosting;

namespace Mosaic.Server.Tests.BandFiles;

/// <summary>The ingest command over a folder of chip files: every chip of every file, then each band's canvas.</summary>
public sealed class BandIngestTests(BandFilesFixture data) : IClassFixture<BandFilesFixture>
{
    [Fact]
    public async Task Ingest_builds_every_chip_file_and_both_canvases_lists_the_unreadable_file_and_the_server_finds_them_ready()
    {
        var dataDir = Path.Combine(data.Root, $"ingest-{Guid.NewGuid():N}");
        var quad = Path.Combine(dataDir, "quad");
        Directory.CreateDirectory(quad);
        foreach (var file in Directory.GetFiles(Path.Combine(data.DataDirectory, "quad")))
            File.Copy(file, Path.Combine(quad, Path.GetFileName(file)));
        await File.WriteAllTextAsync(Path.Combine(quad, "q5_a.fits"), "not FITS");
        var cache = Path.Combine(data.Root, $"cache-{Guid.NewGuid():N}");

        using var output = new StringWriter();
        using var error = new StringWriter();
        var code = IngestCommand.Run(["--data", dataDir, "--cache", cache], output, error, interactive: false, CancellationToken.None);

        Assert.True(code == IngestCommand.Succeeded, $"exit {code}\n{output}\n{error}");
        Assert.Contains($"skipped {Path.Combine(quad, "q5_a.fits")}", error.ToString());
        // The chip sizes band_files_fixture.py wrote: r 120 x 100, g 110 x 95 (numpy shapes (100, 120) and (95, 110)).
        for (var k = 1; k <= 4; k++)
        {
            Assert.Contains($"ready   quad/r/q{k}_a (120 x 100)", output.ToString());
            Assert.Contains($"ready   quad/g/q{k}_b (110 x 95)", output.ToString());
        }
        Assert.Contains("ready   quad/r/CANVAS", output.ToString());
        Assert.Contains("ready   quad/g/CANVAS", output.ToString());

        using var factory = new MosaicFactory(dataDir, cache);
        using var client = factory.CreateClient();
        var field = await SkyAssert.Get(client, "/api/fields/quad");
        var states = field.GetProperty("bands").EnumerateArray().Where(b => b.GetProperty("error").ValueKind == JsonValueKind.Null)
            .SelectMany(b => b.GetProperty("hdus").EnumerateArray().Select(h => h.GetProperty("pyramid"))
                .Append(b.GetProperty("canvas").GetProperty("pyramid")))
            .Select(p => p.GetProperty("state").GetString()).ToList();
        Assert.Equal(10, states.Count);
        Assert.All(states, s => Assert.Equal("ready", s));
        Assert.Equal("q5_a.fits", Assert.Single(field.GetProperty("problems").EnumerateArray()).GetProperty("file").GetString());
    }
}
