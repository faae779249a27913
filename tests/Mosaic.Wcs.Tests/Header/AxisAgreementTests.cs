using Mosaic.Wcs.Header;
using Mosaic.Wcs.Tests.Projections;
using Xunit.Abstractions;

namespace Mosaic.Wcs.Tests.Header;

/// <summary>
/// Axis handling of FITS WCS Paper I against astropy.wcs (Debian python3-astropy): the latitude axis first, a
/// celestial pair among three axes, angle units other than degrees, and PV{lon}_3 standing in for LONPOLE.
/// </summary>
public sealed class AxisAgreementTests(ITestOutputHelper output)
{
    private static Dictionary<string, object> LatitudeFirst()
    {
        var cards = Cards.Celestial("ZEA", 0, 0, 0.01);
        cards["CTYPE1"] = "DEC--ZEA"; cards["CTYPE2"] = "RA---ZEA";
        cards["CRVAL1"] = -41.5; cards["CRVAL2"] = 133.25;
        return cards;
    }

    private static Dictionary<string, object> ThreeAxes()
    {
        var cards = Cards.Celestial("SIN", 250.0, 36.5, 1);
        foreach (var key in new[] { "CD1_1", "CD1_2", "CD2_1", "CD2_2" }) cards.Remove(key);
        cards["NAXIS"] = 3L;
        cards["CDELT1"] = -2e-4; cards["CDELT2"] = 2e-4;
        cards["PC1_1"] = 0.94; cards["PC1_2"] = -0.34; cards["PC2_1"] = 0.35; cards["PC2_2"] = 0.94;
        cards["CTYPE3"] = "FREQ"; cards["CRPIX3"] = 1.0; cards["CRVAL3"] = 1.4e9; cards["CDELT3"] = 1e5; cards["CUNIT3"] = "Hz";
        return cards;
    }

    private static Dictionary<string, object> ThreeAxesLatitudeFirst()
    {
        var cards = ThreeAxes();
        cards["CTYPE1"] = "DEC--SIN"; cards["CTYPE2"] = "RA---SIN";
        cards["CRVAL1"] = -12.0; cards["CRVAL2"] = 45.0;
        return cards;
    }

    private static Dictionary<string, object> Arcseconds()
    {
        // CUNIT scales CDELT and CRVAL alike (Paper I section 2.1.2).
        var cards = Cards.Celestial("TAN", 0, 0, 1);
        foreach (var key in new[] { "CD1_1", "CD1_2", "CD2_1", "CD2_2" }) cards.Remove(key);
        cards["CUNIT1"] = "arcsec"; cards["CUNIT2"] = "arcsec";
        cards["CDELT1"] = -0.9; cards["CDELT2"] = 0.9; cards["CROTA2"] = 12.5;
        cards["CRVAL1"] = 150.25 * 3600; cards["CRVAL2"] = -2.5 * 3600;
        return cards;
    }

    private static Dictionary<string, object> Radians()
    {
        var cards = Cards.Celestial("STG", 0, 0, 1);
        foreach (var key in new[] { "CD1_1", "CD1_2", "CD2_1", "CD2_2" }) cards.Remove(key);
        cards["CUNIT1"] = "rad"; cards["CUNIT2"] = "rad";
        cards["CDELT1"] = -1e-5; cards["CDELT2"] = 1e-5;
        cards["CRVAL1"] = 4.0; cards["CRVAL2"] = 0.6;
        return cards;
    }

    private static Dictionary<string, object> LonpoleAsPv()
    {
        var cards = Cards.Celestial("TAN", 250.0, 20.0, 0.01);
        cards["PV1_3"] = 170.0;   // Paper II Table 13: PV{lon}_3 is LONPOLE
        return cards;
    }

    private static Dictionary<string, object> TpvLatitudeFirst()
    {
        // TPV's PVi_m belong to header axis i: here PV1_m distort the latitude, PV2_m the longitude.
        var cards = Cards.Celestial("TPV", 0, 0, 5e-4);
        cards["CTYPE1"] = "DEC--TPV"; cards["CTYPE2"] = "RA---TPV";
        cards["CRVAL1"] = 28.0; cards["CRVAL2"] = 310.0;
        cards["PV1_1"] = 1.0002; cards["PV1_2"] = 3e-4; cards["PV1_4"] = 1.2e-3; cards["PV1_7"] = -1.5e-3; cards["PV1_11"] = 1e-3;
        cards["PV2_1"] = 0.9997; cards["PV2_2"] = -2e-4; cards["PV2_5"] = 8e-4; cards["PV2_10"] = 6e-4;
        return cards;
    }

    private static readonly (string Name, Dictionary<string, object> Cards)[] Table =
    [
        ("latitude first", LatitudeFirst()),
        ("three axes", ThreeAxes()),
        ("three axes, latitude first", ThreeAxesLatitudeFirst()),
        ("arcsec units", Arcseconds()),
        ("radian units", Radians()),
        ("LONPOLE as PV1_3", LonpoleAsPv()),
    ];

    private static readonly Lazy<AgreementBatch> Batch = new(() => new AgreementBatch(Table));

    public static TheoryData<string> Names => new(Table.Select(t => t.Name));

    [Theory]
    [MemberData(nameof(Names))]
    public void AgreesWithAstropy(string name) => output.WriteLine(AgreementCase.Report(name, Batch.Value.Verify(name)));

    [Fact]
    public void LatitudeFirstIsReadAsLongitudeAndLatitude()
    {
        var h = Batch.Value.Case("latitude first").Wcs.Header;
        Assert.Equal(2, h.LongitudeAxis);
        Assert.Equal(1, h.LatitudeAxis);
        Assert.Equal("RA---ZEA", h.CType1);
        Assert.Equal(133.25, h.CrVal1);
        // Pixel axis 1 moves the latitude: row 2 of the reduced matrix is the header's CD1_j.
        Assert.Equal(-0.01 * 0.9659258, h.Cd21, 15);
    }

    [Fact]
    public void CelestialAxesOffTheImagePlaneAreRefused()
    {
        var cards = ThreeAxes();
        cards["CTYPE2"] = "FREQ"; cards["CTYPE3"] = "DEC--SIN";
        var error = Assert.Throws<WcsHeaderException>(() => WcsHeader.From(Cards.ToHeader(cards)));
        Assert.Equal("CTYPE3", error.Keyword);
        Assert.Contains("image axes 1 and 2", error.Message);
    }

    [Fact]
    public void MatrixCouplingTheSkyToAnotherAxisIsRefused()
    {
        var cards = ThreeAxes();
        cards["PC1_3"] = 0.01;
        var error = Assert.Throws<WcsHeaderException>(() => WcsHeader.From(Cards.ToHeader(cards)));
        Assert.Equal("PC1_3", error.Keyword);
    }

    [Fact]
    public void TpvWithTheLatitudeFirstIsRefused()
    {
        // On these cards astropy (wcslib 7.12) lands 1.4 deg away from the reading that gives PV1_m to axis 1; with no
        // agreed reading, Mosaic refuses the header rather than pick one.
        var error = Assert.Throws<NotSupportedException>(() => Wcs.From(Cards.ToHeader(TpvLatitudeFirst())));
        Assert.Contains("TPV", error.Message);
    }

    [Fact]
    public void MovedFiducialPointIsRefusedByName()
    {
        var cards = Cards.Celestial("TAN", 10, 20);
        cards["PV1_2"] = 80.0;
        var error = Assert.Throws<NotSupportedException>(() => Wcs.From(Cards.ToHeader(cards)));
        Assert.Contains("PV1_2", error.Message);
    }

    [Fact]
    public void AngleUnitsOtherThanDegreesScaleTheMatrix()
    {
        // Paper I section 2.1.2: 0.9 arcsec = 2.5e-4 deg.
        var h = Batch.Value.Case("arcsec units").Wcs.Header;
        Assert.Equal(-0.9 / 3600 * Math.Cos(12.5 * Math.PI / 180), h.Cd11, 15);
        Assert.Equal(150.25, h.CrVal1, 12);
    }

    [Fact]
    public void NonAngleUnitIsAHeaderError()
    {
        var cards = Arcseconds();
        cards["CUNIT2"] = "Hz";
        var error = Assert.Throws<WcsHeaderException>(() => WcsHeader.From(Cards.ToHeader(cards)));
        Assert.Equal("CUNIT2", error.Keyword);
    }
}
