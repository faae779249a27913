using Mosaic.Wcs.Distortion;
using Mosaic.Wcs.Header;
using Mosaic.Wcs.Tests.Projections;
using Xunit.Abstractions;

namespace Mosaic.Wcs.Tests.Distortion;

/// <summary>
/// The TPV convention against astropy.wcs (Debian python3-astropy; wcslib translates TPV into its own polynomial
/// distortion): forward at a grid of pixels within 1 mas, and the iterative inverse within 1e-6 px.
/// </summary>
public sealed class TpvAgreementTests(ITestOutputHelper output)
{
    private static Dictionary<string, object> TpvCards(bool cdelt = false, bool radial = false)
    {
        // A 1 deg field (1.8 arcsec/px) with a few arcsec of distortion at the edges, a made-up but typical magnitude.
        var cards = Cards.Celestial("TPV", 210.5, -12.25, 5e-4);
        cards["PV1_0"] = 2e-5; cards["PV1_1"] = 1.0003; cards["PV1_2"] = 4e-4;
        cards["PV1_4"] = 1.5e-3; cards["PV1_5"] = -8e-4; cards["PV1_6"] = 6e-4;
        cards["PV1_7"] = -2.1e-3; cards["PV1_8"] = 4e-4; cards["PV1_9"] = -1.2e-3; cards["PV1_10"] = 3e-4;
        cards["PV1_17"] = 5e-4; cards["PV1_22"] = -2e-4;
        cards["PV2_0"] = -1e-5; cards["PV2_1"] = 0.9996; cards["PV2_2"] = -3e-4;
        cards["PV2_4"] = -1.1e-3; cards["PV2_5"] = 9e-4; cards["PV2_6"] = 2e-4;
        cards["PV2_7"] = 1.7e-3; cards["PV2_9"] = -6e-4; cards["PV2_10"] = 8e-4;
        cards["PV2_12"] = 4e-4; cards["PV2_16"] = -3e-4; cards["PV2_31"] = 1e-4;
        if (radial)
        {
            cards["PV1_3"] = 1e-4; cards["PV1_11"] = 2e-3; cards["PV2_3"] = -2e-4; cards["PV2_23"] = 5e-4;
        }
        if (cdelt) ToCdeltForm(cards);
        return cards;
    }

    /// <summary>
    /// The same WCS with CDELT/PC: wcslib applies TPV to PC (p - r) and scales by CDELT afterwards, so a term
    /// u^a v^b of axis i carries c * s_i^(a-1) * s_j^b to stay the same distortion (worked by hand from that reading).
    /// </summary>
    private static void ToCdeltForm(Dictionary<string, object> cards)
    {
        const double s = 5e-4;
        foreach (var key in new[] { "CD1_1", "CD1_2", "CD2_1", "CD2_2" }) cards.Remove(key);
        cards["CDELT1"] = -s; cards["CDELT2"] = s;
        cards["PC1_1"] = 0.9659258; cards["PC1_2"] = -0.2588190; cards["PC2_1"] = 0.2600000; cards["PC2_2"] = 0.9659258;
        // The convention's term order: per order n, own^n, own^(n-1) other, ..., other^n (then r^n for odd n, unused here).
        var powers = new List<(int Own, int Other)> { (0, 0) };
        for (var n = 1; n <= 7; n++)
        {
            for (var j = 0; j <= n; j++) powers.Add((n - j, j));
            if (n % 2 == 1) powers.Add((-1, -1));
        }
        foreach (var (axis, own, other) in new[] { (1, -s, s), (2, s, -s) })
            for (var m = 0; m < powers.Count; m++)
            {
                if (!cards.TryGetValue($"PV{axis}_{m}", out var value)) continue;
                var (a, b) = powers[m];
                if (a < 0) throw new InvalidOperationException("radial terms do not rescale term by term");
                cards[$"PV{axis}_{m}"] = (double)value * Math.Pow(own, a - 1) * Math.Pow(other, b);
            }
    }

    private static readonly (string Name, Dictionary<string, object> Cards)[] Table =
    [
        ("TPV CD", TpvCards()),
        ("TPV CDELT+PC", TpvCards(cdelt: true)),
        ("TPV radial terms", TpvCards(radial: true)),
    ];

    private static readonly Lazy<AgreementBatch> Batch = new(() => new AgreementBatch(Table));

    public static TheoryData<string> Names => new(Table.Select(t => t.Name));

    [Theory]
    [MemberData(nameof(Names))]
    public void AgreesWithAstropy(string name) => output.WriteLine(AgreementCase.Report(name, Batch.Value.Verify(name)));

    [Fact]
    public void CdeltFormGivesTheSameSkyAsTheCdForm()
    {
        var cd = Batch.Value.Case("TPV CD").Wcs;
        var cdelt = Batch.Value.Case("TPV CDELT+PC").Wcs;
        foreach (var (x, y) in new[] { (1.0, 1.0), (2000.0, 1.0), (1.0, 2000.0), (2000.0, 2000.0), (700.0, 1300.0) })
        {
            Assert.True(cd.TryPixelToSky(x, y, out var ra1, out var dec1));
            Assert.True(cdelt.TryPixelToSky(x, y, out var ra2, out var dec2));
            Assert.True(AgreementCase.Separation(ra1, dec1, ra2, dec2) < 0.001 * AgreementCase.MilliArcsecond, $"pixel ({x}, {y})");
        }
    }

    [Fact]
    public void DistortionIsLargeEnoughToMatter()
    {
        // The same cards read as plain TAN must land arcseconds away, so the agreement above tests the polynomial.
        var tpv = Batch.Value.Case("TPV CD").Wcs;
        var cards = TpvCards();
        cards["CTYPE1"] = "RA---TAN"; cards["CTYPE2"] = "DEC--TAN";
        foreach (var key in cards.Keys.Where(k => k.StartsWith("PV", StringComparison.Ordinal)).ToList()) cards.Remove(key);
        var tan = Wcs.From(Cards.ToHeader(cards));
        Assert.True(tpv.TryPixelToSky(1, 1, out var ra1, out var dec1));
        Assert.True(tan.TryPixelToSky(1, 1, out var ra2, out var dec2));
        Assert.True(AgreementCase.Separation(ra1, dec1, ra2, dec2) * 3600 > 2);
        Assert.Equal("TAN", tpv.ProjectionCode);
        Assert.Equal("TPV", tpv.DistortionName);
    }

    [Fact]
    public void ForwardMatchesTheConventionByHand()
    {
        // The TPV term order written out for x = 0.3, y = -0.2 (degrees): 1, x, y, r, x^2, xy, y^2, x^3, x^2y, xy^2, y^3.
        var c = new double[TpvPolynomial.TermCount];
        c[0] = 0.01; c[1] = 1.1; c[2] = 0.2; c[3] = 0.05; c[4] = 0.3; c[5] = -0.4; c[6] = 0.5; c[8] = 0.7; c[11] = -0.6;
        var p = new TpvPolynomial(c);
        double x = 0.3, y = -0.2, r = Math.Sqrt(x * x + y * y);
        var expected = 0.01 + 1.1 * x + 0.2 * y + 0.05 * r + 0.3 * x * x - 0.4 * x * y + 0.5 * y * y + 0.7 * x * x * y - 0.6 * r * r * r;
        Assert.Equal(expected, p.Evaluate(x, y).Value, 14);
    }

    [Fact]
    public void MissingLinearTermsAreAHeaderError()
    {
        // wcslib, and so astropy, take absent TPV coefficients as zero: without PV1_1/PV2_1 the mapping collapses.
        var cards = Cards.Celestial("TPV", 10, 20);
        cards["PV1_5"] = 1e-3;
        var error = Assert.Throws<WcsHeaderException>(() => Wcs.From(Cards.ToHeader(cards)));
        Assert.Equal("PV1_1", error.Keyword);
    }

    [Theory]
    [InlineData("TNX")]
    [InlineData("ZPX")]
    public void OtherPolynomialConventionsAreRefusedByName(string code)
    {
        var error = Assert.Throws<NotSupportedException>(() => Wcs.From(Cards.ToHeader(Cards.Celestial(code, 10, 20))));
        Assert.Contains(code, error.Message);
    }
}
