using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Stretches;

namespace Mosaic.Imaging.Tests.Display;

/// <summary>Bad parameters fail at construction with a typed error naming the parameter (the project's rule for bad input).</summary>
public sealed class ParameterValidationTests
{
    [Theory]
    [InlineData(double.NaN, 1, "lo")]
    [InlineData(double.NegativeInfinity, 1, "lo")]
    [InlineData(0, double.PositiveInfinity, "hi")]
    [InlineData(0, 1e39, "hi")]
    [InlineData(1, 1, "hi")]
    [InlineData(2, 1, "hi")]
    [InlineData(1000, 1000.0001, "hi")]
    public void Manual_limits_need_finite_ordered_distinguishable_values(double lo, double hi, string parameter)
    {
        var error = Assert.ThrowsAny<ArgumentException>(() => new ManualLimits(lo, hi));
        Assert.Equal(parameter, error.ParamName);
        Assert.Contains(parameter, error.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(-1, 50, "lowerPercent")]
    [InlineData(100, 100, "lowerPercent")]
    [InlineData(double.NaN, 50, "lowerPercent")]
    [InlineData(0, 0, "upperPercent")]
    [InlineData(0, 100.5, "upperPercent")]
    [InlineData(60, 40, "upperPercent")]
    [InlineData(50, 50, "upperPercent")]
    public void Percentile_limits_need_0_le_lower_lt_upper_le_100(double lower, double upper, string parameter)
    {
        var error = Assert.ThrowsAny<ArgumentException>(() => new PercentileLimits(lower, upper));
        Assert.Equal(parameter, error.ParamName);
        Assert.Contains(parameter, error.Message, StringComparison.Ordinal);
    }

    [Theory]
    [InlineData(double.NaN, 1, "sigmasBelow")]
    [InlineData(1, double.PositiveInfinity, "sigmasAbove")]
    [InlineData(-2, 1, "sigmasAbove")]
    [InlineData(0, 0, "sigmasAbove")]
    public void Robust_limits_need_finite_sigmas_spanning_a_positive_width(double below, double above, string parameter)
    {
        var error = Assert.ThrowsAny<ArgumentException>(() => new RobustLimits(below, above));
        Assert.Equal(parameter, error.ParamName);
        Assert.Contains(parameter, error.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Robust_limits_may_sit_both_above_the_median()
    {
        // lo = median + 1 sigma is a legitimate choice (hide the sky entirely); only the width must be positive.
        var limits = new RobustLimits(-1, 3);
        Assert.Equal(-1, limits.SigmasBelow);
    }

    [Theory]
    [InlineData(0)]
    [InlineData(-3)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void Softening_must_be_positive(double soft)
    {
        var physical = Assert.Throws<ArgumentOutOfRangeException>(() => Softening.Physical(soft));
        Assert.Equal("soft", physical.ParamName);
        Assert.Contains("soft must be > 0", physical.Message, StringComparison.Ordinal);
        var sigmas = Assert.Throws<ArgumentOutOfRangeException>(() => Softening.Sigmas(soft));
        Assert.Equal("soft", sigmas.ParamName);
    }

    [Fact]
    public void Asinh_refuses_an_empty_softening_and_a_non_finite_pivot()
    {
        var empty = Assert.Throws<ArgumentOutOfRangeException>(() => new AsinhStretch(default));
        Assert.Equal("soft", empty.ParamName);
        Assert.Contains("soft must be > 0", empty.Message, StringComparison.Ordinal);
        var pivot = Assert.Throws<ArgumentOutOfRangeException>(() => new AsinhStretch(Softening.Sigmas(3), double.NaN));
        Assert.Equal("pivot", pivot.ParamName);
        Assert.Contains("pivot", pivot.Message, StringComparison.Ordinal);
    }

    [Fact]
    public void Asinh_curve_refuses_bad_physical_parameters()
    {
        Assert.Equal("soft", Assert.Throws<ArgumentOutOfRangeException>(() => new AsinhCurve(0, 1, 0, 0)).ParamName);
        Assert.Equal("hi", Assert.Throws<ArgumentOutOfRangeException>(() => new AsinhCurve(1, 1, 1, 0)).ParamName);
        Assert.Equal("pivot", Assert.Throws<ArgumentOutOfRangeException>(() => new AsinhCurve(0, 1, 1, double.NaN)).ParamName);
    }

    [Fact]
    public void Combined_limits_need_both_rules()
    {
        Assert.Equal("lower", Assert.Throws<ArgumentNullException>(() => new CombinedLimits(null!, new PercentileLimits(0, 100))).ParamName);
        Assert.Equal("upper", Assert.Throws<ArgumentNullException>(() => new CombinedLimits(new PercentileLimits(0, 100), null!)).ParamName);
    }

    [Fact]
    public void Value_range_needs_lo_below_hi()
    {
        Assert.Equal("hi", Assert.Throws<ArgumentException>(() => new ValueRange(2, 1)).ParamName);
        Assert.Equal("lo", Assert.Throws<ArgumentOutOfRangeException>(() => new ValueRange(double.NaN, 1)).ParamName);
    }

    [Fact]
    public void Display_settings_refuse_missing_parts()
    {
        Assert.Equal("Limits", Assert.Throws<ArgumentNullException>(() => DisplaySettings.Default with { Limits = null! }).ParamName);
        Assert.Equal("Stretch", Assert.Throws<ArgumentNullException>(() => DisplaySettings.Default with { Stretch = null! }).ParamName);
        Assert.Equal("Palette", Assert.Throws<ArgumentNullException>(() => DisplaySettings.Default with { Palette = null! }).ParamName);
    }

    [Theory]
    [InlineData(0)]
    [InlineData(-1)]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    public void Power_gamma_and_log_a_must_be_positive_and_finite(double value)
    {
        var gamma = Assert.Throws<ArgumentOutOfRangeException>(() => new PowerStretch(value));
        Assert.Equal("gamma", gamma.ParamName);
        Assert.Contains("gamma", gamma.Message);
        var a = Assert.Throws<ArgumentOutOfRangeException>(() => new LogStretch(value));
        Assert.Equal("a", a.ParamName);
        Assert.Contains("a must be", a.Message);
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.NegativeInfinity)]
    [InlineData(1e39)]
    public void Asinh_pivot_must_be_a_finite_value(double value)
        => Assert.Equal("pivot", Assert.Throws<ArgumentOutOfRangeException>(() => AsinhPivot.At(value)).ParamName);

    [Fact]
    public void Asinh_refuses_a_missing_pivot()
        => Assert.Equal("pivot", Assert.Throws<ArgumentNullException>(() => new AsinhStretch(Softening.Sigmas(3), (AsinhPivot)null!)).ParamName);
}
