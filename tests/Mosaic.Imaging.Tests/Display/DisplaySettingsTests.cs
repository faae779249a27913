using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;

namespace Mosaic.Imaging.Tests.Display;

public sealed class DisplaySettingsTests
{
    private static DisplaySettings[] Variants() =>
    [
        DisplaySettings.Default,
        DisplaySettings.Default with { Stretch = new LinearStretch() },
        DisplaySettings.Default with { Stretch = new AsinhStretch(Softening.Sigmas(2)) },
        DisplaySettings.Default with { Stretch = new AsinhStretch(Softening.Physical(3)) },
        DisplaySettings.Default with { Stretch = new AsinhStretch(Softening.Sigmas(3), 0) },
        DisplaySettings.Default with { Stretch = new AsinhStretch(Softening.Sigmas(3), 100) },
        DisplaySettings.Default with { Limits = new ManualLimits(0, 100) },
        DisplaySettings.Default with { Limits = new ManualLimits(0, 100.5) },
        DisplaySettings.Default with { Limits = new ManualLimits(0.5, 100) },
        DisplaySettings.Default with { Limits = new PercentileLimits(0.5, 99.5) },
        DisplaySettings.Default with { Limits = new PercentileLimits(0.5, 99.9) },
        DisplaySettings.Default with { Limits = new RobustLimits(2, 10) },
        DisplaySettings.Default with { Limits = new RobustLimits(10, 2) },
        DisplaySettings.Default with { Limits = new CombinedLimits(new RobustLimits(1, 1), new PercentileLimits(0, 99.9)) },
        DisplaySettings.Default with { Limits = new CombinedLimits(new PercentileLimits(0, 99.9), new RobustLimits(1, 1)) },
        DisplaySettings.Default with { Stretch = new AsinhStretch(Softening.Sigmas(3), AsinhPivot.AtMedian) },
        DisplaySettings.Default with { Stretch = new SqrtStretch() },
        DisplaySettings.Default with { Stretch = new PowerStretch(2) },
        DisplaySettings.Default with { Stretch = new PowerStretch(0.5) },
        DisplaySettings.Default with { Stretch = new LogStretch(1000) },
        DisplaySettings.Default with { Stretch = new LogStretch(10) },
        DisplaySettings.Default with { Stretch = new HistEqStretch() },
        DisplaySettings.Default with { Palette = new InvertedGrayPalette() },
        DisplaySettings.Default with { Palette = new CubehelixPalette() },
        DisplaySettings.Default with { Palette = new CubehelixPalette(0.5, -1.5, 1.0, 2.0) },
        DisplaySettings.Default with { Palette = PaletteCatalog.Create("ember") },
        DisplaySettings.Default with { Palette = PaletteCatalog.Create("glacier") },
        DisplaySettings.Default with { Palette = PaletteCatalog.Create("lichen") },
        DisplaySettings.Default with { Masked = MaskedColor.Parse("ff00ff") },
        DisplaySettings.Default with { Masked = MaskedColor.Parse("00ff00") },
    ];

    [Fact]
    public void Default_is_the_designed_asinh_display()
    {
        // The product design: lo = median - 2 sigma, hi = 99.9th percentile, asinh with soft = 3 sigma and pivot lo, gray.
        var settings = DisplaySettings.Default;
        Assert.Equal(new CombinedLimits(new RobustLimits(2, 2), new PercentileLimits(0, 99.9)), settings.Limits);
        Assert.Equal(new AsinhStretch(Softening.Sigmas(3)), settings.Stretch);
        Assert.Equal(AsinhPivot.AtLo, ((AsinhStretch)settings.Stretch).Pivot);
        Assert.Equal(MaskedColor.Transparent, settings.Masked);
        Assert.Equal(new GrayPalette(), settings.Palette);
    }

    [Fact]
    public void Equal_settings_built_apart_have_equal_keys()
    {
        var a = new DisplaySettings { Limits = new ManualLimits(-0.0, 10), Stretch = new AsinhStretch(Softening.Physical(0.1)) };
        var b = new DisplaySettings { Limits = new ManualLimits(0, 10), Stretch = new AsinhStretch(Softening.Physical(0.1)) };
        Assert.Equal(a, b);
        Assert.Equal(a.CanonicalKey, b.CanonicalKey);
        Assert.Equal(DisplaySettings.Default.CanonicalKey, new DisplaySettings().CanonicalKey);
        // Written differently, meaning the same: pivot given as -0 and 0, masked colour in either case, palette from
        // the catalog or built, cubehelix with its default parameters spelled out.
        var c = DisplaySettings.Default with { Stretch = new AsinhStretch(Softening.Sigmas(3), AsinhPivot.At(-0.0)), Masked = MaskedColor.Parse("FF00AA") };
        var d = DisplaySettings.Default with { Stretch = new AsinhStretch(Softening.Sigmas(3), 0), Masked = MaskedColor.Parse("ff00aa") };
        Assert.Equal(c.CanonicalKey, d.CanonicalKey);
        Assert.Equal(c, d);
        var e = DisplaySettings.Default with { Palette = PaletteCatalog.Create("cubehelix") };
        var f = DisplaySettings.Default with { Palette = new CubehelixPalette(0.5, -1.5, 1, 1) };
        Assert.Equal(e.CanonicalKey, f.CanonicalKey);
        Assert.Equal(e, f);
    }

    [Fact]
    public void Different_settings_have_different_keys()
    {
        var variants = Variants();
        Assert.Equal(variants.Length, variants.Select(v => v.CanonicalKey).Distinct(StringComparer.Ordinal).Count());
        Assert.Equal(variants.Length, variants.Distinct().Count());
    }

    [Fact]
    public void Keys_are_safe_inside_cache_paths_and_etags()
    {
        foreach (var key in Variants().Select(v => v.CanonicalKey))
            Assert.DoesNotContain(key, c => c is '/' or '"' or '\\' || char.IsWhiteSpace(c) || char.IsControl(c) || c > 127);
    }

    [Fact]
    public void Keys_do_not_depend_on_the_culture()
    {
        var settings = DisplaySettings.Default with { Limits = new ManualLimits(0.25, 1234.5) };
        var before = settings.CanonicalKey;
        var culture = Thread.CurrentThread.CurrentCulture;
        try
        {
            // A culture writing decimal commas and grouping digits: the key must not change with it.
            var odd = (System.Globalization.CultureInfo)System.Globalization.CultureInfo.InvariantCulture.Clone();
            odd.NumberFormat.NumberDecimalSeparator = ",";
            odd.NumberFormat.NumberGroupSeparator = ".";
            odd.NumberFormat.NegativeSign = "~";
            Thread.CurrentThread.CurrentCulture = odd;
            Assert.Equal(before, settings.CanonicalKey);
            Assert.Equal(before, (DisplaySettings.Default with { Limits = new ManualLimits(0.25, 1234.5) }).CanonicalKey);
        }
        finally
        {
            Thread.CurrentThread.CurrentCulture = culture;
        }
        Assert.Contains("0.25", before, StringComparison.Ordinal);
        Assert.Contains("1234.5", before, StringComparison.Ordinal);
    }

    [Fact]
    public void Default_shows_the_sky_dark_but_not_black_and_sources_white()
    {
        var sky = SyntheticSky.Make(512, 512, seed: 11);
        var (statistics, histogram) = SyntheticSky.Statistics(sky);
        var toneMap = DisplaySettings.Default.Compile(statistics, histogram);
        var levels = new byte[sky.Length];
        toneMap.Apply(sky, levels);
        // Design intent: the sky median sits above black with its noise visible, 2 sigma under it is black,
        // and the brightest 0.1% are white.
        var median = toneMap.LevelOf((float)statistics.Median);
        Assert.InRange(median, 16, 96);
        Assert.True(toneMap.LevelOf((float)(statistics.Median + statistics.MadSigma)) - median >= 8, "one sigma of sky noise should be visible");
        Assert.Equal(0, toneMap.LevelOf((float)(statistics.Median - 2.01 * statistics.MadSigma)));
        Assert.Equal(255, toneMap.LevelOf((float)statistics.Max));
        var white = levels.Count(l => l == 255) / (double)levels.Length;
        Assert.InRange(white, 0.0005, 0.003);
    }
}
