using System.Text.Json;
using Microsoft.Extensions.DependencyInjection;
using Mosaic.Server.Fields;

namespace Mosaic.Server.Tests.BandFiles;

/// <summary>A chip file that lands in a served folder joins its band; the other files keep their pyramids.</summary>
public sealed class AddedFileTests(BandFilesFixture data) : IClassFixture<BandFilesFixture>
{
    [Fact]
    public async Task A_file_added_later_joins_its_band_whose_version_changes_while_unchanged_files_keep_their_pyramids()
    {
        var dataDir = Path.Combine(data.Root, $"adding-{Guid.NewGuid():N}");
        var quad = Path.Combine(dataDir, "quad");
        Directory.CreateDirectory(quad);
        foreach (var file in Directory.GetFiles(Path.Combine(data.DataDirectory, "quad")).Where(f => !f.EndsWith("q4_a.fits", StringComparison.Ordinal)))
            File.Copy(file, Path.Combine(quad, Path.GetFileName(file)));

        using var factory = new MosaicFactory(dataDir, Path.Combine(data.Root, $"cache-{Guid.NewGuid():N}"));
        using var client = factory.CreateClient();
        var before = await CanvasDataFixture.WaitForCanvasesAsync(client, "quad");
        var catalog = factory.Services.GetRequiredService<FieldCatalog>();
        var keysBefore = catalog.Get("quad").ResolveBand("r").Hdus.Select(h => h.PyramidKey).ToList();
        Assert.Equal(["q1_a", "q2_a", "q3_a"], Hdus(before, "r").Select(h => h.GetProperty("name").GetString()));

        File.Copy(Path.Combine(data.DataDirectory, "quad", "q4_a.fits"), Path.Combine(quad, "q4_a.fits"));
        await Task.Delay(1100); // the catalog looks at the folder again at most once a second
        var after = await SkyAssert.Get(client, "/api/fields/quad");

        Assert.Equal(["q1_a", "q2_a", "q3_a", "q4_a"], Hdus(after, "r").Select(h => h.GetProperty("name").GetString()));
        Assert.NotEqual(Version(before, "r"), Version(after, "r"));
        // The pyramids of the unchanged files are keyed by their own file: the same keys, ready at once.
        var keysAfter = catalog.Get("quad").ResolveBand("r").Hdus.Select(h => h.PyramidKey).ToList();
        Assert.Equal(keysBefore, keysAfter.Take(3));
        Assert.All(Hdus(after, "r").Take(3), h => Assert.Equal("ready", h.GetProperty("pyramid").GetProperty("state").GetString()));
        // The new chip is served once its pyramid is built (probing by pixel reads the file itself).
        var probe = await SkyAssert.Get(client, "/api/fields/quad/probe?band=r&hdu=3&x=60&y=50");
        Assert.Equal("q4_a.fits", probe.GetProperty("file").GetString());

        // g's files did not change: its chips and version stay, though the field's canvas may grow with r's new chip.
        Assert.Equal(Hdus(before, "g").Select(h => h.GetProperty("name").GetString()), Hdus(after, "g").Select(h => h.GetProperty("name").GetString()));
        Assert.Equal(Version(before, "g"), Version(after, "g"));

        File.Delete(Path.Combine(quad, "q1_a.fits"));
        await Task.Delay(1100);
        var gone = await SkyAssert.Get(client, "/api/fields/quad");
        Assert.Equal(["q2_a", "q3_a", "q4_a"], Hdus(gone, "r").Select(h => h.GetProperty("name").GetString()));
        Assert.NotEqual(Version(after, "r"), Version(gone, "r"));
    }

    private static IEnumerable<JsonElement> Hdus(JsonElement field, string band) =>
        field.GetProperty("bands").EnumerateArray().Single(b => b.GetProperty("name").GetString() == band).GetProperty("hdus").EnumerateArray();

    private static string? Version(JsonElement field, string band) =>
        field.GetProperty("bands").EnumerateArray().Single(b => b.GetProperty("name").GetString() == band).GetProperty("version").GetString();
}
