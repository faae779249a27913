using Xunit.Abstractions;

namespace Mosaic.Wcs.Tests.Projections;

/// <summary>
/// The zenithal, cylindrical and pseudo-cylindrical projections first supported, against astropy.wcs (Debian
/// python3-astropy, wcslib inside) on the same cards, in one astropy process for the class: sky positions within
/// 1 milliarcsecond, pixels within 1e-6 px, and the same verdict on points with no solution.
/// </summary>
public sealed class AstropyAgreementTests(ITestOutputHelper output)
{
    private static Dictionary<string, object> With(string code, double crval1, double crval2, double scale, params (string Key, object Value)[] extra)
    {
        var cards = Cards.Celestial(code, crval1, crval2, scale);
        foreach (var (key, value) in extra) cards[key] = value;
        return cards;
    }

    private static readonly (string Name, Dictionary<string, object> Cards, bool ExpectUnsolved)[] Table =
    [
        // CRVAL1, CRVAL2, CD scale (deg/px); the large scales reach the edge of each projection's domain.
        ("TAN", With("TAN", 150.25, 2.5, 2.8e-4), false),
        ("TAN south pole", With("TAN", 10.0, -89.5, 2.8e-4), false),     // across RA = 0 next to the pole
        ("TAN wide", With("TAN", 45.0, 30.0, 0.05), false),
        ("SIN", With("SIN", 210.0, 54.0, 2.8e-4), false),
        ("SIN wide", With("SIN", 30.0, -20.0, 0.06), true),              // the disc edge falls inside the image
        ("SIN slanted", With("SIN", 95.0, -35.0, 0.03, ("PV2_1", 0.12), ("PV2_2", -0.3)), false),
        ("ARC", With("ARC", 120.0, 60.0, 0.2), true),                    // R > 180 deg reached in the corners
        ("STG", With("STG", 300.0, -45.0, 0.1), false),
        ("ZEA", With("ZEA", 15.0, 75.0, 0.15), true),                    // R > 360/pi reached in the corners
        ("CAR", With("CAR", 180.0, 0.0, 0.05), false),
        ("CAR oblique", With("CAR", 80.0, 30.0, 0.02), false),           // delta_p from LONPOLE/LATPOLE defaults (Paper II eq. 8)
        ("CAR south of theta0", With("CAR", 200.0, -40.0, 0.02), false), // delta0 < theta0: LONPOLE 180, eq. 8 root wraps past -180
        ("NCP", With("NCP", 60.0, 40.0, 2.8e-4), false),
        ("CEA", With("CEA", 100.0, 10.0, 0.06), true),                   // |y| > 180/pi reached at the top and bottom
        ("CEA lambda", With("CEA", 120.0, 0.0, 0.05, ("PV2_1", 0.6)), false),
        ("CYP", With("CYP", 30.0, 20.0, 0.05), false),
        ("CYP mu lambda", With("CYP", 200.0, -10.0, 0.05, ("PV2_1", 2.0), ("PV2_2", 0.7)), false),
        ("MER", With("MER", 200.0, -15.0, 0.04), false),
        ("SFL", With("SFL", 0.0, 0.0, 0.2), true),                       // |phi| > 180 reached in the corners
        ("PAR", With("PAR", 340.0, 5.0, 0.2), true),
        ("MOL", With("MOL", 0.0, 0.0, 0.2), true),                       // outside the ellipse in the corners
        ("MOL oblique", With("MOL", 45.0, 60.0, 0.03), false),
        ("AIT", With("AIT", 0.0, 0.0, 0.2), true),
        ("AIT oblique", With("AIT", 266.0, -29.0, 0.05), false),
        ("CAR LONPOLE LATPOLE", With("CAR", 250.0, 20.0, 0.03, ("LONPOLE", 30.0), ("LATPOLE", -30.0)), false),
        ("TAN LONPOLE", With("TAN", 250.0, 20.0, 0.01, ("LONPOLE", 170.0)), false),
    ];

    private static readonly Lazy<AgreementBatch> Batch = new(() => new AgreementBatch(Table.Select(t => (t.Name, t.Cards))));

    public static TheoryData<string> Names => new(Table.Select(t => t.Name));

    [Theory]
    [MemberData(nameof(Names))]
    public void AgreesWithAstropy(string name)
    {
        var expectUnsolved = Table.Single(t => t.Name == name).ExpectUnsolved;
        output.WriteLine(AgreementCase.Report(name, Batch.Value.Verify(name, expectUnsolved)));
    }

    [Fact]
    public void LonpoleWithNoCelestialPoleIsRefused()
    {
        // Paper II eq. 8 with theta0 = 0: sin(delta0) = cos(delta_p) cos(phi_p - phi0) has no solution for
        // delta0 = 20 deg, LONPOLE = 150 deg (cos 150 < 0), so no rotation exists.
        var cards = Cards.Celestial("CAR", 250.0, 20.0, 0.03);
        cards["LONPOLE"] = 150.0;
        var error = Assert.Throws<Mosaic.Wcs.Header.WcsHeaderException>(() => Wcs.From(Cards.ToHeader(cards)));
        Assert.Equal("LONPOLE", error.Keyword);
    }

    /// <summary>One card set against astropy in its own process, for tests outside a batch.</summary>
    internal static void Check(Dictionary<string, object> cards)
    {
        var c = AgreementCase.Prepare(cards["CTYPE1"].ToString()!, cards);
        c.Verify(AstropyReference.Transform(cards, c.Pixels, c.Sky));
    }
}
