using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Tests.Display;

/// <summary>How the limit rules resolve, from statistics given by hand (so the expected values follow from the definitions).</summary>
public sealed class LimitsTests
{
    private static readonly ValueHistogram NoHistogram = new();

    // A field with median 100, MAD sigma 10, values 95..5000.
    private static readonly BandStatistics Field = new(Count: 1000, Masked: 0, Min: 95, Max: 5000, Mean: 120, Median: 100, MadSigma: 10);

    [Fact]
    public void Manual_limits_resolve_to_themselves()
    {
        var range = new ManualLimits(-3.5, 17.25).Resolve(Field, NoHistogram);
        Assert.Equal(-3.5, range.Lo);
        Assert.Equal(17.25, range.Hi);
    }

    [Fact]
    public void Robust_limits_are_median_minus_and_plus_sigmas()
    {
        // lo = 100 - 0.5 * 10, hi = 100 + 3 * 10 (the rule's definition).
        var range = new RobustLimits(0.5, 3).Resolve(Field, NoHistogram);
        Assert.Equal(95, range.Lo, 12);
        Assert.Equal(130, range.Hi, 12);
    }

    [Fact]
    public void Robust_limits_stay_inside_the_field_range()
    {
        // 100 - 2 * 10 = 80 is below the field's min 95; 100 + 1000 * 10 is above its max 5000.
        var range = new RobustLimits(2, 1000).Resolve(Field, NoHistogram);
        Assert.Equal(95, range.Lo);
        Assert.Equal(5000, range.Hi);
    }

    [Fact]
    public void Combined_limits_take_lo_from_the_first_rule_and_hi_from_the_second()
    {
        var range = new CombinedLimits(new RobustLimits(0.5, 0.5), new ManualLimits(0, 400)).Resolve(Field, NoHistogram);
        Assert.Equal(95, range.Lo, 12);
        Assert.Equal(400, range.Hi);
    }

    [Fact]
    public void A_field_with_no_spread_falls_back_to_its_min_and_max()
    {
        // More than half the pixels equal: MAD sigma 0 gives lo = hi, so the whole range is shown instead.
        var spiky = Field with { MadSigma = 0 };
        var range = new RobustLimits(2, 2).Resolve(spiky, NoHistogram);
        Assert.Equal(95, range.Lo);
        Assert.Equal(5000, range.Hi);
    }

    [Fact]
    public void A_flat_field_gets_a_narrow_range_around_its_value_and_renders_uniformly()
    {
        var values = Enumerable.Repeat(42.5f, 4096).ToArray();
        var (statistics, histogram) = SyntheticSky.Statistics(values);
        var range = DisplaySettings.Default.Limits.Resolve(statistics, histogram);
        Assert.True(range.Lo < 42.5 && 42.5 < range.Hi, $"{range.Lo}..{range.Hi} should straddle the field's value");
        var levels = new byte[values.Length];
        var masked = DisplaySettings.Default.Compile(statistics, histogram).Apply(values, levels);
        Assert.Equal(0, masked);
        Assert.All(levels, level => Assert.Equal(levels[0], level));
    }

    [Fact]
    public void A_field_with_no_finite_pixel_still_compiles_and_masks_everything()
    {
        var values = Enumerable.Repeat(float.NaN, 100).ToArray();
        var (statistics, histogram) = SyntheticSky.Statistics(values);
        var toneMap = DisplaySettings.Default.Compile(statistics, histogram);
        var levels = new byte[values.Length];
        Assert.Equal(values.Length, toneMap.Apply(values, levels));
        Assert.All(levels, level => Assert.Equal(0, level));
    }

    [Fact]
    public void Sigma_softening_scales_with_the_field_sigma()
    {
        // soft = 3 sigma: doubling sigma must double the physical softening (the unit's definition).
        Assert.Equal(30, Softening.Sigmas(3).PhysicalFor(10), 12);
        Assert.Equal(60, Softening.Sigmas(3).PhysicalFor(20), 12);
        Assert.Equal(7, Softening.Physical(7).PhysicalFor(20));
    }
}
