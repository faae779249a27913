using Mosaic.Wcs.Coordinates;

namespace Mosaic.Wcs.Tests.Coordinates;

public sealed class SexagesimalFormatterTests
{
    [Theory]
    // Expected strings worked out by hand: RA hours = degrees / 15.
    [InlineData(188.73625, "12:34:56.700")]
    [InlineData(0.0, "00:00:00.000")]
    [InlineData(15.0, "01:00:00.000")]
    // 12:34:59.9995 rounds to 12:35:00.000, not 12:34:60.000.
    [InlineData(15.0 * (12 + 34 / 60.0 + 59.9996 / 3600.0), "12:35:00.000")]
    // 23:59:59.9996 rounds up to 24h, which is 00h.
    [InlineData(15.0 * (23 + 59 / 60.0 + 59.9996 / 3600.0), "00:00:00.000")]
    [InlineData(-15.0, "23:00:00.000")]
    [InlineData(360.0, "00:00:00.000")]
    public void Formats_RA_as_hours_with_carried_rounding(double degrees, string expected) =>
        Assert.Equal(expected, SexagesimalFormatter.FormatRightAscension(degrees));

    [Theory]
    [InlineData(-1.0341666666666667, "-01:02:03.00")]
    [InlineData(-0.5, "-00:30:00.00")]
    [InlineData(0.5, "+00:30:00.00")]
    [InlineData(90.0, "+90:00:00.00")]
    [InlineData(-90.0, "-90:00:00.00")]
    // 10°59′59.996″ carries through seconds and minutes into 11°.
    [InlineData(10 + 59 / 60.0 + 59.996 / 3600.0, "+11:00:00.00")]
    // A value that rounds to zero is printed without a minus sign (common practice).
    [InlineData(-1e-9, "+00:00:00.00")]
    public void Formats_Dec_with_sign_and_carried_rounding(double degrees, string expected) =>
        Assert.Equal(expected, SexagesimalFormatter.FormatDeclination(degrees));

    [Fact]
    public void Honours_the_number_of_second_decimals()
    {
        Assert.Equal("12:34:57", SexagesimalFormatter.FormatRightAscension(188.73625, 0));
        Assert.Equal("12:34:56.70000", SexagesimalFormatter.FormatRightAscension(188.73625, 5));
        Assert.Equal("-01:02:03.0", SexagesimalFormatter.FormatDeclination(-1.0341666666666667, 1));
        Assert.Equal("188.736250", SexagesimalFormatter.FormatDegrees(188.73625));
        Assert.Equal("-1.03", SexagesimalFormatter.FormatDegrees(-1.0341666666666667, 2));
        Assert.Equal("0.00", SexagesimalFormatter.FormatDegrees(-0.001, 2));
        Assert.Equal("12:34:56.700 -01:02:03.00", SexagesimalFormatter.Format(new SkyPosition(188.73625, -1.0341666666666667)));
    }

    [Fact]
    public void Rejects_bad_arguments()
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => SexagesimalFormatter.FormatRightAscension(double.NaN));
        Assert.Throws<ArgumentOutOfRangeException>(() => SexagesimalFormatter.FormatRightAscension(10, 7));
        Assert.Throws<ArgumentOutOfRangeException>(() => SexagesimalFormatter.FormatDeclination(90.5));
        Assert.Throws<ArgumentOutOfRangeException>(() => SexagesimalFormatter.FormatDegrees(double.PositiveInfinity));
    }

    [Fact]
    public void Formatted_text_parses_back_within_half_the_last_digit()
    {
        var random = new Random(20260101);
        for (var k = 0; k < 2000; k++)
        {
            var ra = random.NextDouble() * 360.0;
            var dec = random.NextDouble() * 180.0 - 90.0;
            var text = SexagesimalFormatter.Format(new SkyPosition(ra, dec));
            var back = PositionParser.Parse(text);
            // Half of 0.001 s of time is 0.0075″ of RA along the equator; half of 0.01″ for Dec; a little slack for doubles.
            var raError = Math.Abs(Math.IEEERemainder(back.RightAscension - ra, 360.0)) * 3600.0;
            Assert.True(raError <= 0.0075 + 1e-9, $"{text}: RA off by {raError}″");
            Assert.True(Math.Abs(back.Declination - dec) * 3600.0 <= 0.005 + 1e-9, $"{text}: Dec off");
        }
    }
}
