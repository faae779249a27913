using Mosaic.Wcs.Header;
using Mosaic.Wcs.Tests.Projections;

namespace Mosaic.Wcs.Tests.Header;

public sealed class WcsHeaderTests
{
    [Theory]
    [InlineData("CRPIX1")]
    [InlineData("CRVAL2")]
    [InlineData("CTYPE2")]
    public void MissingCardIsNamed(string keyword)
    {
        var cards = Cards.Celestial("TAN", 10, 20);
        cards.Remove(keyword);
        var error = Assert.Throws<WcsHeaderException>(() => WcsHeader.From(Cards.ToHeader(cards)));
        Assert.Equal(keyword, error.Keyword);
    }

    [Fact]
    public void NonNumericValueIsNamed()
    {
        var cards = Cards.Celestial("TAN", 10, 20);
        cards["CRVAL1"] = "ten";
        var error = Assert.Throws<WcsHeaderException>(() => WcsHeader.From(Cards.ToHeader(cards)));
        Assert.Equal("CRVAL1", error.Keyword);
    }

    [Fact]
    public void MissingScaleWithoutCdIsNamed()
    {
        var cards = Cards.Celestial("TAN", 10, 20);
        foreach (var key in new[] { "CD1_1", "CD1_2", "CD2_1", "CD2_2" }) cards.Remove(key);
        cards["CDELT2"] = 1e-4;
        var error = Assert.Throws<WcsHeaderException>(() => WcsHeader.From(Cards.ToHeader(cards)));
        Assert.Equal("CDELT1", error.Keyword);
    }

    [Fact]
    public void NonCelestialAxisIsRefused()
    {
        var cards = Cards.Celestial("TAN", 10, 20);
        cards["CTYPE1"] = "FREQ";
        var error = Assert.Throws<WcsHeaderException>(() => WcsHeader.From(Cards.ToHeader(cards)));
        Assert.Equal("CTYPE1", error.Keyword);
    }

    [Theory]
    [InlineData("XPH")]
    [InlineData("QQQ")]
    public void UnsupportedProjectionNamesIt(string code)
    {
        var cards = Cards.Celestial(code, 10, 20);
        var error = Assert.Throws<NotSupportedException>(() => Wcs.From(Cards.ToHeader(cards)));
        Assert.Contains(code, error.Message);
    }

    [Fact]
    public void UnsupportedDistortionSuffixIsRefused()
    {
        var cards = Cards.Celestial("TAN", 10, 20);
        cards["CTYPE1"] = "RA---TAN-TPV";
        cards["CTYPE2"] = "DEC--TAN-TPV";
        var error = Assert.Throws<NotSupportedException>(() => Wcs.From(Cards.ToHeader(cards)));
        Assert.Contains("TPV", error.Message);
    }

    [Fact]
    public void SipWithoutOrderIsNamed()
    {
        var cards = Cards.Celestial("TAN", 10, 20);
        cards["CTYPE1"] = "RA---TAN-SIP";
        cards["CTYPE2"] = "DEC--TAN-SIP";
        cards["B_ORDER"] = 2L;
        var error = Assert.Throws<WcsHeaderException>(() => Wcs.From(Cards.ToHeader(cards)));
        Assert.Equal("A_ORDER", error.Keyword);
    }

    [Fact]
    public void PcWithCdeltMatchesPaperIProduct()
    {
        // Paper I section 2.1.2 eq. 3 form: CD_ij = CDELT_i * PC_ij.
        var cards = Cards.Celestial("TAN", 10, 20);
        foreach (var key in new[] { "CD1_1", "CD1_2", "CD2_1", "CD2_2" }) cards.Remove(key);
        cards["CDELT1"] = -2e-4; cards["CDELT2"] = 3e-4;
        cards["PC1_1"] = 0.8; cards["PC1_2"] = 0.6; cards["PC2_1"] = -0.6; cards["PC2_2"] = 0.8;
        var h = WcsHeader.From(Cards.ToHeader(cards));
        Assert.Equal(-1.6e-4, h.Cd11, 15);
        Assert.Equal(-1.2e-4, h.Cd12, 15);
        Assert.Equal(-1.8e-4, h.Cd21, 15);
        Assert.Equal(2.4e-4, h.Cd22, 15);
        AstropyAgreementTests.Check(cards);
    }

    [Fact]
    public void Crota2FormAgreesWithAstropy()
    {
        // Paper II section 6.1 eq. 188 (CROTA2 to PC) checked end to end against astropy.wcs.
        var cards = Cards.Celestial("TAN", 200, -40, 1);
        foreach (var key in new[] { "CD1_1", "CD1_2", "CD2_1", "CD2_2" }) cards.Remove(key);
        cards["CDELT1"] = -2.5e-4; cards["CDELT2"] = 2.0e-4; cards["CROTA2"] = 27.5;
        var h = WcsHeader.From(Cards.ToHeader(cards));
        // Eq. 188: PC2_1 = (CDELT1/CDELT2) sin(rho), so CD2_1 = CDELT2 * PC2_1 = CDELT1 sin(rho).
        Assert.Equal(-2.5e-4 * Math.Sin(27.5 * Math.PI / 180), h.Cd21, 15);
        AstropyAgreementTests.Check(cards);
    }

    [Fact]
    public void ProjectionParameterBeyondPaperIIRangeIsNamed()
    {
        // Paper II: ZPN's polynomial runs to PV2_20; a PV2_21 would otherwise be ignored without a word.
        var cards = Cards.Celestial("ZPN", 10, 20);
        cards["PV2_1"] = 1.0;
        cards["PV2_21"] = 1e-9;
        var error = Assert.Throws<WcsHeaderException>(() => WcsHeader.From(Cards.ToHeader(cards)));
        Assert.Equal("PV2_21", error.Keyword);
    }

    [Fact]
    public void ReferenceSystemCardsAreRead()
    {
        var cards = Cards.Celestial("TAN", 10, 20);
        cards["RADESYS"] = "FK5"; cards["EQUINOX"] = 2000.0;
        var h = WcsHeader.From(Cards.ToHeader(cards));
        Assert.Equal("FK5", h.RadeSys);
        Assert.Equal(2000.0, h.Equinox);
    }
}
