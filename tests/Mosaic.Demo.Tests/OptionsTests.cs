namespace Mosaic.Demo.Tests;

/// <summary>Option validation: bad input is an <see cref="ArgumentException"/> naming the option, before any file is touched.</summary>
public sealed class OptionsTests
{
    private static readonly DemoFieldOptions Good = DemoFieldOptions.Small("/nonexistent/mosaic-demo-never-written");

    public static TheoryData<string, DemoFieldOptions> BadOptions() => new()
    {
        { "OutputDirectory", Good with { OutputDirectory = " " } },
        { "ChipWidth", Good with { ChipWidth = 10 } },
        { "ChipHeight", Good with { ChipHeight = 20_000 } },
        { "ChipWidth", Good with { ChipWidth = 16_384, ChipHeight = 16_384 } },
        { "ChipColumns", Good with { ChipColumns = 0 } },
        { "ChipColumns", Good with { ChipColumns = 10, ChipRows = 10 } },
        { "GapPixels", Good with { GapPixels = 2 } },
        { "GapPixels", Good with { GapPixels = 400 } },
        { "Bands", Good with { Bands = [] } },
        { "Bands", Good with { Bands = [DemoBand.Red, DemoBand.Red] } },
        { "Name", Good with { Bands = [DemoBand.Red with { Name = "Red Band" }] } },
        { "Name", Good with { Bands = [DemoBand.Red with { Name = "../red" }] } },
        { "SkyElectrons", Good with { Bands = [DemoBand.Red with { SkyElectrons = -1 }] } },
        { "PsfFwhmPixels", Good with { Bands = [DemoBand.Red with { PsfFwhmPixels = 0.5 }] } },
        { "PsfBeta", Good with { Bands = [DemoBand.Red with { PsfBeta = 1.0 }] } },
    };

    [Theory]
    [MemberData(nameof(BadOptions))]
    public void Bad_options_are_rejected_with_the_option_named(string parameter, DemoFieldOptions options)
    {
        var e = Assert.ThrowsAny<ArgumentException>(() => DemoFieldGenerator.Generate(options));
        Assert.Equal(parameter, e.ParamName);
        Assert.False(Directory.Exists(options.OutputDirectory));
    }

    [Fact]
    public void Presets_are_valid_and_have_at_least_eight_chips_and_the_large_one_a_gigapixel_per_band()
    {
        foreach (var preset in new[] { DemoFieldOptions.Small("x"), DemoFieldOptions.Default("x"), DemoFieldOptions.Large("x") })
        {
            preset.Validate();
            Assert.True(preset.ChipCount >= 8);
            Assert.Equal(["blue", "green", "red"], preset.Bands.Select(b => b.Name));
        }
        var large = DemoFieldOptions.Large("x");
        Assert.True((long)large.ChipWidth * large.ChipHeight * large.ChipCount >= 1_000_000_000);
        var standard = DemoFieldOptions.Default("x");
        Assert.Equal((2048, 4096, 4, 2), (standard.ChipWidth, standard.ChipHeight, standard.ChipColumns, standard.ChipRows));
    }
}
