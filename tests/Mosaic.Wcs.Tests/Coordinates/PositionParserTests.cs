using Mosaic.Wcs.Coordinates;

namespace Mosaic.Wcs.Tests.Coordinates;

public sealed class PositionParserTests
{
    // Sexagesimal RA: 1 h = 15°, 1 m = 1/60, 1 s = 1/3600 (common practice; FITS WCS Paper II uses degrees throughout).
    private static double Hms(double h, double m, double s) => 15.0 * (h + m / 60.0 + s / 3600.0);

    private static double Dms(double d, double m, double s) => d + m / 60.0 + s / 3600.0;

    private const double Tolerance = 1e-10;

    /// <summary>Text, expected RA and Dec worked out by hand, the form astropy is given (null: astropy has no such form), its RA unit.</summary>
    private static readonly (string Text, double Ra, double Dec, string? AstropyText, bool RaInHours)[] Table =
    [
        ( "12:34:56.7 -01:02:03", Hms(12, 34, 56.7), -Dms(1, 2, 3), "12:34:56.7 -01:02:03", true ),
        ( "12 34 56.7 -01 02 03", Hms(12, 34, 56.7), -Dms(1, 2, 3), "12 34 56.7 -01 02 03", true ),
        ( "12h34m56.7s -1d02m03s", Hms(12, 34, 56.7), -Dms(1, 2, 3), "12h34m56.7s -1d02m03s", true ),
        ( "12h 34m 56.7s +1° 02' 03\"", Hms(12, 34, 56.7), Dms(1, 2, 3), "12h34m56.7s +1d02m03s", true ),
        ( "12h34m56.7s -1°02′03″", Hms(12, 34, 56.7), -Dms(1, 2, 3), "12h34m56.7s -1°02′03″", true ),
        ( "188.736 -1.034", 188.736, -1.034, "188.736 -1.034", false ),
        ( "188.736,-1.034", 188.736, -1.034, "188.736 -1.034", false ),
        ( "  188.736 ,  +1.034 ", 188.736, 1.034, "188.736 1.034", false ),
        // The sign belongs to the whole Dec, also when the degrees field is zero.
        ( "12:34:56.7 -00:30:00", Hms(12, 34, 56.7), -0.5, "12:34:56.7 -00:30:00", true ),
        ( "00:00:00 -00:00:01.5", 0.0, -1.5 / 3600.0, "00:00:00 -00:00:01.5", true ),
        ( "23:59:59.999 +89:59:59.9", Hms(23, 59, 59.999), Dms(89, 59, 59.9), "23:59:59.999 +89:59:59.9", true ),
        ( "0 0 0, -90 0 0", 0.0, -90.0, "0 0 0 -90 0 0", true ),
        ( "12:34:56.7, -01:02:03", Hms(12, 34, 56.7), -Dms(1, 2, 3), "12:34:56.7 -01:02:03", true ),
        ( "6:30 +45:15", Hms(6, 30, 0), Dms(45, 15, 0), "6:30 +45:15", true ),
        ( "359.9999 90", 359.9999, 90.0, "359.9999 90", false ),
        ( "0 -90", 0.0, -90.0, "0 -90", false ),
        ( "12h30m -1d30m", Hms(12, 30, 0), -Dms(1, 30, 0), "12h30m -1d30m", true ),
        ( "12.5h 10.25d", 12.5 * 15.0, 10.25, "12.5h 10.25d", true ),
        ( "12:34:56.7 \u22121.5", Hms(12, 34, 56.7), -1.5, null, true ),
        ( "188d44m10.5s -1d02m03s", Dms(188, 44, 10.5), -Dms(1, 2, 3), "188d44m10.5s -1d02m03s", false ),
    ];

    public static TheoryData<string, double, double> Cases()
    {
        var data = new TheoryData<string, double, double>();
        foreach (var row in Table) data.Add(row.Text, row.Ra, row.Dec);
        return data;
    }

    [Theory]
    [MemberData(nameof(Cases))]
    public void Parses_to_the_hand_computed_degrees(string text, double ra, double dec)
    {
        var position = PositionParser.Parse(text);
        Assert.Equal(ra, position.RightAscension, Tolerance);
        Assert.Equal(dec, position.Declination, Tolerance);
    }

    [Fact]
    public void Agrees_with_astropy_SkyCoord_parsing_of_the_same_strings()
    {
        var rows = Table.Where(r => r.AstropyText is not null).Select(r => (r.Text, r.AstropyText, r.RaInHours)).ToList();
        // Outside check: astropy.coordinates.SkyCoord(text, unit=(hourangle|deg, deg)) from python3-astropy.
        var reference = AstropyCoordinates.Parse(rows.Select(r => (r.Item2!, r.Item3)).ToList());
        for (var k = 0; k < rows.Count; k++)
        {
            var ours = PositionParser.Parse(rows[k].Item1);
            var distance = AngularDistance.Milliarcseconds(ours.RightAscension, ours.Declination, reference[k].Lon, reference[k].Lat);
            Assert.True(distance < 1e-3, $"\"{rows[k].Item1}\": ours ({ours.RightAscension}, {ours.Declination}), astropy ({reference[k].Lon}, {reference[k].Lat}), {distance} mas apart");
        }
    }

    [Fact]
    public void TryParse_returns_the_position_for_good_text_and_false_for_bad()
    {
        Assert.True(PositionParser.TryParse("10 20", out var good));
        Assert.Equal(10.0, good!.RightAscension);
        Assert.Equal(20.0, good.Declination);
        Assert.False(PositionParser.TryParse("10", out var bad));
        Assert.Null(bad);
        Assert.False(PositionParser.TryParse(null, out _));
    }
}
