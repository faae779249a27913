using Mosaic.Wcs.Header;
using Xunit.Abstractions;

namespace Mosaic.Wcs.Tests.Projections;

/// <summary>
/// COP, COE, COD and COO (FITS WCS Paper II section 5.5) against astropy.wcs (Debian python3-astropy, wcslib inside)
/// on rotated, skewed headers with theta_a = PV2_1 and eta = PV2_2, in one astropy process for the class.
/// </summary>
public sealed class ConicAgreementTests(ITestOutputHelper output)
{
    private static Dictionary<string, object> With(string code, double crval1, double crval2, double scale, double thetaA, double? eta)
    {
        var cards = Cards.Celestial(code, crval1, crval2, scale);
        cards["PV2_1"] = thetaA;
        if (eta is not null) cards["PV2_2"] = eta.Value;
        return cards;
    }

    private static readonly (string Name, Dictionary<string, object> Cards, bool ExpectUnsolved)[] Table =
    [
        ("COP", With("COP", 150.0, 40.0, 0.03, 45.0, 10.0), false),
        ("COP wide", With("COP", 20.0, -10.0, 0.1, -30.0, 20.0), true),      // past the divergence at theta_a - 90
        ("COE", With("COE", 300.0, -35.0, 0.05, -30.0, 15.0), false),
        ("COE wide", With("COE", 100.0, 20.0, 0.15, 25.0, 5.0), true),       // corners beyond the image of the sphere
        ("COD", With("COD", 45.0, 65.0, 0.05, 60.0, 20.0), false),
        ("COD single parallel", With("COD", 210.0, 10.0, 0.04, 15.0, null), false),
        ("COO", With("COO", 75.0, 30.0, 0.05, 35.0, 10.0), false),
        ("COO south", With("COO", 330.0, -55.0, 0.03, -50.0, 5.0), false),
        ("COO wide", With("COO", 5.0, 50.0, 0.12, 45.0, 15.0), true),
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

    [Theory]
    [InlineData("COP")]
    [InlineData("COE")]
    [InlineData("COD")]
    [InlineData("COO")]
    public void ThetaAIsRequired(string code)
    {
        // Paper II section 5.5: PV2_1 has no default for the conics (wcslib refuses the header too).
        var error = Assert.Throws<WcsHeaderException>(() => Wcs.From(Cards.ToHeader(Cards.Celestial(code, 10, 20))));
        Assert.Equal("PV2_1", error.Keyword);
    }
}
