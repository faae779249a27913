using Mosaic.Wcs.Coordinates;

namespace Mosaic.Wcs.Tests.Coordinates;

public sealed class SkyPositionTests
{
    [Theory]
    // RA is a longitude: any whole turn added or taken away names the same direction (common practice).
    [InlineData(-10.0, 350.0)]
    [InlineData(360.0, 0.0)]
    [InlineData(725.5, 5.5)]
    [InlineData(-1e-17, 0.0)]
    public void RA_is_normalised_to_one_turn(double given, double expected) =>
        Assert.Equal(expected, new SkyPosition(given, 0).RightAscension, 1e-12);

    [Theory]
    [InlineData(0.0, 90.0001)]
    [InlineData(0.0, -90.0001)]
    [InlineData(0.0, double.NaN)]
    [InlineData(double.PositiveInfinity, 0.0)]
    public void Rejects_impossible_values(double ra, double dec) =>
        Assert.Throws<ArgumentOutOfRangeException>(() => new SkyPosition(ra, dec));
}
