using System.Net.Http.Json;
using System.Text.Json;
using System.Text.RegularExpressions;
using Mosaic.Server.Hosting;
using Mosaic.Testing;

namespace Mosaic.Server.Tests.Ingest;

public sealed partial class IngestCommandTests(IngestDataFixture data) : IClassFixture<IngestDataFixture>
{
    private const string ManifestFile = "manifest.json";

    [Fact]
    public async Task Builds_every_pyramid_and_histogram_and_the_server_then_starts_with_them_ready()
    {
        var cache = data.NewCacheDirectory();
        var (code, output, error) = Ingest(["--data", data.DataDirectory, "--cache", cache], interactive: false);

        Assert.True(code == IngestCommand.Succeeded, $"exit {code}\n{output}\n{error}");
        // The unreadable file is listed, not fatal.
        Assert.Contains("garbled.fits", error);
        // Every image HDU astropy wrote is reported built, at the size numpy gives it.
        foreach (var image in data.Reference.RootElement.GetProperty("images").EnumerateArray())
        {
            var description = $"{image.GetProperty("field").GetString()}/{image.GetProperty("band").GetString()}";
            Assert.Matches($@"ready +{Regex.Escape(description)}/\S+ \({image.GetProperty("width").GetInt32()} x {image.GetProperty("height").GetInt32()}\)", output);
        }
        // Both bands have two chips with a celestial WCS, so each gets a whole-field canvas, built after its chips.
        foreach (var band in data.Reference.RootElement.GetProperty("bands").EnumerateObject())
            Assert.Matches($@"(?m)^ +ready +camp/{band.Name}/CANVAS \(\d+ x \d+\)", output);
        Assert.True(output.LastIndexOf("camp/a/CHIP2", StringComparison.Ordinal) < output.IndexOf("camp/a/CANVAS", StringComparison.Ordinal), output);
        var built = CacheFiles(cache);

        using var factory = new MosaicFactory(data.DataDirectory, cache);
        using var client = factory.CreateClient();
        var fields = await client.GetFromJsonAsync<JsonElement>("/api/fields");
        // The first listing: every pyramid the server knows of (chips and anything else it lists) is ready already.
        var states = PyramidStates(fields).ToList();
        Assert.NotEmpty(states);
        Assert.All(states, s => Assert.Equal("ready", s));
        // One pyramid folder per image HDU, named by band version and HDU, each with its manifest.
        var images = fields.EnumerateArray().SelectMany(f => f.GetProperty("bands").EnumerateArray())
            .SelectMany(b => b.GetProperty("hdus").EnumerateArray().Select(h => $"{b.GetProperty("version").GetString()}-{h.GetProperty("index").GetInt32()}"))
            .ToList();
        Assert.Equal(data.Reference.RootElement.GetProperty("images").GetArrayLength(), images.Count);
        foreach (var key in images) Assert.True(File.Exists(Path.Combine(cache, "pyramids", key, ManifestFile)), $"no pyramid {key} in {cache}");

        // The histograms were built too: field-wide statistics against numpy's count, NaN count, min and max.
        foreach (var band in data.Reference.RootElement.GetProperty("bands").EnumerateObject())
        {
            var stats = await client.GetFromJsonAsync<JsonElement>($"/api/fields/camp/stats?band={band.Name}");
            Assert.Equal(band.Value.GetProperty("count").GetInt64(), stats.GetProperty("count").GetInt64());
            Assert.Equal(band.Value.GetProperty("masked").GetInt64(), stats.GetProperty("masked").GetInt64());
            Assert.Equal(band.Value.GetProperty("min").GetDouble(), stats.GetProperty("min").GetDouble());
            Assert.Equal(band.Value.GetProperty("max").GetDouble(), stats.GetProperty("max").GetDouble());
        }
        // Nothing was rebuilt or added: the cache is file for file, byte count and time what the ingest left.
        Assert.Equal(built, CacheFiles(cache));
    }

    [Fact]
    public void A_second_ingest_finds_everything_built_and_builds_nothing()
    {
        var cache = data.NewCacheDirectory();
        Assert.Equal(IngestCommand.Succeeded, Ingest(["--data", data.DataDirectory, "--cache", cache], interactive: false).Code);
        var built = CacheFiles(cache);

        var (code, output, _) = Ingest(["--data", data.DataDirectory, "--cache", cache], interactive: false);

        Assert.Equal(IngestCommand.Succeeded, code);
        Assert.Contains("Nothing to build", output);
        Assert.DoesNotMatch(@"(?m)^ +ready ", output);
        Assert.Equal(built, CacheFiles(cache));
    }

    [Fact]
    public void One_field_builds_that_field_only()
    {
        var cache = data.NewCacheDirectory();
        var (code, output, error) = Ingest(["--data", data.DataDirectory, "--cache", cache, "--field", "plain"], interactive: false);

        Assert.True(code == IngestCommand.Succeeded, $"exit {code}\n{output}\n{error}");
        Assert.Matches(@"ready +plain/plain/PRIMARY \(170 x 130\)", output);
        Assert.DoesNotContain("camp/", output);
        // Nothing of the other fields is built, nor left half-built.
        var folders = Directory.GetDirectories(Path.Combine(cache, "pyramids"));
        Assert.Single(folders);
        Assert.True(File.Exists(Path.Combine(folders[0], ManifestFile)));
    }

    [Fact]
    public void Reports_progress_as_plain_lines_with_percent_bar_and_eta_when_not_a_terminal()
    {
        var (code, output, _) = Ingest(["--data", data.DataDirectory, "--cache", data.NewCacheDirectory()], interactive: false);

        Assert.Equal(IngestCommand.Succeeded, code);
        Assert.DoesNotContain('\r', output);
        var bars = output.Split('\n').Where(l => BarLine().IsMatch(l)).ToList();
        Assert.True(bars.Count >= 2, output); // the first state and the last, at least
        Assert.StartsWith("  0% [", bars[0]);
        Assert.StartsWith($"100% [{new string('#', 28)}]", bars[^1]);
        Assert.Matches(@"Built \d+ pyramids \([\d.]+ [kMG]px\) in [\d.]+ s, [\d.]+ [kMG]px/s; 0 already in the cache; peak memory \d+ MiB\.", output);
    }

    [Fact]
    public void Rewrites_one_bar_line_in_place_on_a_terminal()
    {
        var (code, output, _) = Ingest(["--data", data.DataDirectory, "--cache", data.NewCacheDirectory()], interactive: true);

        Assert.Equal(IngestCommand.Succeeded, code);
        // Each redraw starts with a carriage return; the finished bar is then left on its own line.
        Assert.Contains('\r', output);
        Assert.Matches($@"\r100% \[{new string('#', 28)}\][^\r\n]*\n", output);
        // Lines printed while the bar is up (a pyramid ready) first blank the bar, so none is glued to it.
        Assert.DoesNotMatch(@"ETA [^\r\n]*ready", output);
    }

    [Fact]
    public void The_bar_shows_rate_and_time_left_from_the_pixels_done_so_far()
    {
        // Worked by hand: 0.5 Gpx of 2 Gpx in 10 s is 50 Mpx/s and 25 %; 1.5 Gpx left at that rate is 30 s; 7 of 28 marks.
        var line = IngestDisplay.Format(new IngestSnapshot(0.5e9, 2_000_000_000, 3, 8, TimeSpan.FromSeconds(10), "f/b/CHIP4"));

        Assert.Equal($" 25% [{new string('#', 7)}{new string('-', 21)}] 500.0 Mpx of 2.00 Gpx  3/8 pyramids  50.0 Mpx/s  ETA 0:30  f/b/CHIP4", line);
        // No rate yet, no time left: nothing to go on.
        Assert.Contains("ETA --:--", IngestDisplay.Format(new IngestSnapshot(0, 1000, 0, 1, TimeSpan.FromSeconds(0.1), null)));
        Assert.Equal("1:01:05", IngestDisplay.Duration(TimeSpan.FromSeconds(3665)));
    }

    [Fact]
    public void Fails_clearly_on_a_missing_data_folder_from_the_program_itself()
    {
        var missing = Path.Combine(data.Root, "no-such-folder");
        var cache = data.NewCacheDirectory();
        // The server's own program, as `dotnet run --project server/Mosaic.Server -- ingest ...` runs it.
        var result = ExternalProgram.Run("dotnet", [Path.Combine(AppContext.BaseDirectory, "Mosaic.Server.dll"), "ingest", "--data", missing, "--cache", cache]);

        Assert.Equal(IngestCommand.BadArguments, result.ExitCode);
        Assert.Contains($"the data folder {missing} does not exist", result.Stderr);
        Assert.False(Directory.Exists(cache));
    }

    [Fact]
    public void Fails_clearly_on_an_unknown_field_an_unknown_option_and_an_empty_folder()
    {
        var unknownField = Ingest(["--data", data.DataDirectory, "--cache", data.NewCacheDirectory(), "--field", "nowhere"], interactive: false);
        Assert.Equal(IngestCommand.BadArguments, unknownField.Code);
        Assert.Contains("no field 'nowhere'", unknownField.Error);
        Assert.Contains("camp, garbled, plain", unknownField.Error);

        var unknownOption = Ingest(["--data", data.DataDirectory, "--fast"], interactive: false);
        Assert.Equal(IngestCommand.BadArguments, unknownOption.Code);
        Assert.Contains("unknown argument '--fast'", unknownOption.Error);
        Assert.Contains(IngestArguments.Usage, unknownOption.Error);

        var noValue = Ingest(["--data"], interactive: false);
        Assert.Equal(IngestCommand.BadArguments, noValue.Code);
        Assert.Contains("--data needs a value", noValue.Error);

        var empty = Path.Combine(data.Root, $"empty-{Guid.NewGuid():N}");
        Directory.CreateDirectory(empty);
        var nothing = Ingest(["--data", empty, "--cache", data.NewCacheDirectory()], interactive: false);
        Assert.Equal(IngestCommand.Failed, nothing.Code);
        Assert.Contains("nothing to ingest", nothing.Error);
    }

    private static (int Code, string Output, string Error) Ingest(string[] args, bool interactive)
    {
        using var output = new StringWriter();
        using var error = new StringWriter();
        var code = IngestCommand.Run(args, output, error, interactive, CancellationToken.None);
        return (code, output.ToString(), error.ToString());
    }

    /// <summary>Every "pyramid" status object anywhere in the listing: chips, and whatever else has one.</summary>
    private static IEnumerable<string> PyramidStates(JsonElement element)
    {
        if (element.ValueKind == JsonValueKind.Array)
            return element.EnumerateArray().SelectMany(PyramidStates);
        if (element.ValueKind != JsonValueKind.Object) return [];
        return element.EnumerateObject().SelectMany(p =>
            p.Name == "pyramid" && p.Value.ValueKind == JsonValueKind.Object && p.Value.TryGetProperty("state", out var state)
                ? [state.GetString() ?? ""]
                : PyramidStates(p.Value));
    }

    private static SortedDictionary<string, (long, DateTime)> CacheFiles(string cache)
    {
        var files = new SortedDictionary<string, (long, DateTime)>(StringComparer.Ordinal);
        foreach (var file in new DirectoryInfo(cache).EnumerateFiles("*", SearchOption.AllDirectories))
            files[Path.GetRelativePath(cache, file.FullName)] = (file.Length, file.LastWriteTimeUtc);
        return files;
    }

    [GeneratedRegex(@"^ *\d+% \[[#-]{28}\] [\d.]+ [kMG]px of [\d.]+ [kMG]px  \d+/\d+ pyramids  (-|[\d.]+ [kMG]px/s)  ETA (--:--|\d+:\d\d)")]
    private static partial Regex BarLine();
}
