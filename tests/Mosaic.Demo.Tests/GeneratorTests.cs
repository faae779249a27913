using Mosaic.Demo.Tests.Support;

namespace Mosaic.Demo.Tests;

/// <summary>Files, determinism, progress, cancellation and headers of the generator.</summary>
[Collection(SmallFieldCollection.Name)]
public sealed class GeneratorTests(SmallField field)
{
    [Fact]
    public void Generating_again_with_the_same_options_gives_identical_bytes_and_another_seed_does_not()
    {
        var again = TempDirectory();
        var other = TempDirectory();
        try
        {
            var progress = new Recorder();
            DemoFieldGenerator.Generate(field.Options with { OutputDirectory = again }, progress);
            DemoFieldGenerator.Generate(field.Options with { OutputDirectory = other, Seed = field.Options.Seed + 1 });
            foreach (var band in field.Options.Bands)
            {
                var first = File.ReadAllBytes(field.FileOf(band.Name));
                Assert.Equal(first, File.ReadAllBytes(Path.Combine(again, band.FileName)));
                Assert.NotEqual(first, File.ReadAllBytes(Path.Combine(other, band.FileName)));
            }

            Assert.Equal(field.Options.Bands.Count * field.Options.ChipCount, progress.Values.Count);
            Assert.Equal(progress.Values.OrderBy(v => v), progress.Values);
            Assert.Equal(1.0, progress.Values[^1]);
        }
        finally
        {
            Directory.Delete(again, true);
            Directory.Delete(other, true);
        }
    }

    [Fact]
    public void The_field_is_one_FITS_file_per_band_named_after_it_with_nothing_else_left_behind()
    {
        Assert.Equal(field.Options.Bands.Select(b => Path.Combine(field.Directory, b.FileName)), field.Files);
        Assert.Equal(
            field.Options.Bands.Select(b => b.FileName).Order(),
            Directory.GetFiles(field.Directory).Select(Path.GetFileName).Order());
        Assert.True(DemoFieldGenerator.IsComplete(field.Directory));
        Assert.True(DemoFieldGenerator.IsComplete(field.Options));
        // FITS 4.0 section 3.1 (section number from memory): a file is a whole number of 2880-byte blocks.
        foreach (var file in field.Files) Assert.Equal(0, new FileInfo(file).Length % 2880);
    }

    [Fact]
    public void A_folder_missing_a_band_file_is_not_complete()
    {
        var copy = TempDirectory();
        try
        {
            Assert.False(DemoFieldGenerator.IsComplete(copy));
            Assert.False(DemoFieldGenerator.IsComplete(Path.Combine(copy, "absent")));
            foreach (var band in field.Options.Bands.Skip(1))
                File.Copy(field.FileOf(band.Name), Path.Combine(copy, band.FileName));
            Assert.False(DemoFieldGenerator.IsComplete(copy));
            File.Copy(field.FileOf(field.Options.Bands[0].Name), Path.Combine(copy, field.Options.Bands[0].FileName));
            Assert.True(DemoFieldGenerator.IsComplete(copy));
        }
        finally
        {
            Directory.Delete(copy, true);
        }
    }

    [Fact]
    public void Cancelling_leaves_no_file_at_all()
    {
        var folder = TempDirectory();
        try
        {
            using var cancel = new CancellationTokenSource();
            cancel.Cancel();
            Assert.ThrowsAny<OperationCanceledException>(() =>
                DemoFieldGenerator.Generate(field.Options with { OutputDirectory = folder }, ct: cancel.Token));
            Assert.Empty(Directory.GetFiles(folder));
            Assert.False(DemoFieldGenerator.IsComplete(folder));
        }
        finally
        {
            Directory.Delete(folder, true);
        }
    }

    [Fact]
    public void Headers_carry_the_scenario_band_and_chip_keywords_read_back_by_astropy()
    {
        var chips = field.Scene.Chips;
        var ops = new List<object>
        {
            new { op = "header", file = field.FileOf("green"), ext = 0, keys = new[] { "NAXIS", "EXTEND", "OBSERVAT", "TELESCOP", "INSTRUME", "OBJECT", "FILTER", "DATE-OBS", "EXPTIME", "NEXTEND", "COMMENT" } },
        };
        foreach (var chip in chips)
            ops.Add(new { op = "header", file = field.FileOf("green"), ext = chip.Index + 1, keys = new[] { "XTENSION", "EXTNAME", "BITPIX", "NAXIS1", "NAXIS2", "BUNIT", "FILTER", "GAIN", "RDNOISE", "SATURATE" } });
        var results = AstropyProbe.Run(ops.ToArray());

        var primary = results[0]!;
        Assert.Equal(0, (int)primary["NAXIS"]!);
        Assert.True((bool)primary["EXTEND"]!);
        Assert.Equal("green", (string?)primary["FILTER"]);
        Assert.Equal(chips.Count, (int)primary["NEXTEND"]!);
        foreach (var key in new[] { "OBSERVAT", "TELESCOP", "INSTRUME", "OBJECT", "DATE-OBS" })
            Assert.False(string.IsNullOrWhiteSpace((string?)primary[key]), key);
        Assert.Contains("Synthetic", primary["COMMENT"]!.ToString(), StringComparison.Ordinal);
        Assert.True((double)primary["EXPTIME"]! > 0);

        for (var c = 0; c < chips.Count; c++)
        {
            var h = results[c + 1]!;
            Assert.Equal("IMAGE", (string?)h["XTENSION"]);
            Assert.Equal($"CHIP{c + 1:D2}", (string?)h["EXTNAME"]);
            Assert.Equal(-32, (int)h["BITPIX"]!);
            Assert.Equal(field.Options.ChipWidth, (int)h["NAXIS1"]!);
            Assert.Equal(field.Options.ChipHeight, (int)h["NAXIS2"]!);
            Assert.Equal("adu", (string?)h["BUNIT"]);
            Assert.Equal("green", (string?)h["FILTER"]);
            Assert.InRange((double)h["GAIN"]!, 1.0, 3.0);
            Assert.InRange((double)h["RDNOISE"]!, 2.0, 8.0);
            Assert.InRange((double)h["SATURATE"]!, 30_000, 70_000);
        }
    }

    internal static string TempDirectory()
    {
        var path = Path.Combine(Path.GetTempPath(), $"mosaic-demo-{Guid.NewGuid():N}");
        Directory.CreateDirectory(path);
        return path;
    }

    private sealed class Recorder : IProgress<double>
    {
        public List<double> Values { get; } = [];

        public void Report(double value)
        {
            lock (Values) Values.Add(value);
        }
    }
}
