using Mosaic.Server.Sky;

namespace Mosaic.Server.Tests;

/// <summary>Grid steps and labels. Expected texts are worked by hand from the sexagesimal definitions (1 h = 15°, 1 m = 60 s, 1° = 60′ = 3600″).</summary>
public sealed class GridLabelTests
{
    private const long S = 100, M = 60 * S, H = 60 * M;      // RA: hundredths of a second of time
    private const long AS = 100, AM = 60 * AS, D = 60 * AM;  // Dec: hundredths of an arcsecond

    [Theory]
    [InlineData(10 * H, H, "10h")]
    [InlineData(10 * H, M, "10h00m")]
    [InlineData(10 * H + 30 * S, 30 * S, "10h00m30s")]
    [InlineData(2 * H + 5 * M + 30 * S, 10 * S, "2h05m30s")]
    [InlineData(23 * H + 59 * M + 59 * S + 50, 50, "23h59m59.5s")]
    [InlineData(7 * S + 5, 5, "0h00m07.05s")]
    [InlineData(24 * H + 15 * M, 15 * M, "0h15m")]                  // a whole day wraps away
    [InlineData(-15 * M, 15 * M, "23h45m")]
    public void RA_labels_show_exactly_the_precision_of_the_step(long units, long step, string expected) =>
        Assert.Equal(expected, GridLabels.RightAscension(units, step));

    [Theory]
    [InlineData(45 * D, 5 * D, "+45°")]
    [InlineData(-(2 * D + 30 * AM), 30 * AM, "\u22122°30′")]
    [InlineData(12 * D + 30 * AM + 15 * AS, 15 * AS, "+12°30′15″")]
    [InlineData(3 * D, AM, "+3°00′")]
    [InlineData(0, D, "0°")]
    [InlineData(-30 * AM, 10 * AM, "\u22120°30′")]
    [InlineData(-(89 * D + 59 * AM + 59 * AS + 50), 50, "\u221289°59′59.5″")]
    [InlineData(AS + 2, 2, "+0°00′01.02″")]
    public void Dec_labels_show_exactly_the_precision_of_the_step_with_a_true_minus(long units, long step, string expected) =>
        Assert.Equal(expected, GridLabels.Declination(units, step));

    [Fact]
    public void Every_RA_step_divides_a_day_and_every_Dec_step_the_half_turn_from_pole_to_pole()
    {
        // So that meridians around a pole close up evenly and parallels sit symmetrically about the equator.
        Assert.All(GridSpacing.RaSteps, s => Assert.Equal(0, GridSpacing.RaUnitsPerCircle % s));
        Assert.All(GridSpacing.DecSteps, s => Assert.Equal(0, 180 * GridSpacing.DecUnitsPerDegree % s));
        // Strictly decreasing sequences, as listed in the task.
        Assert.True(GridSpacing.RaSteps.Zip(GridSpacing.RaSteps.Skip(1)).All(p => p.First > p.Second));
        Assert.True(GridSpacing.DecSteps.Zip(GridSpacing.DecSteps.Skip(1)).All(p => p.First > p.Second));
    }

    [Fact]
    public void The_chosen_step_gives_three_to_eight_lines_over_spans_from_arcseconds_to_the_whole_sky()
    {
        // From 3.6″ (the finest steps, 0.01 s and 0.01″, still give several lines) to the whole circle / pole to pole.
        for (var span = 1e-3; span <= 360; span *= 1.07)
        {
            var ra = span * GridSpacing.RaUnitsPerDegree / GridSpacing.ChooseRaStep(span);
            Assert.InRange(ra, 3, 8);
            if (span > 180) continue;
            var dec = span * GridSpacing.DecUnitsPerDegree / GridSpacing.ChooseDecStep(span);
            Assert.InRange(dec, 3, 8);
        }
    }
}
