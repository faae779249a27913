using Mosaic.Wcs.Header;
using Xunit.Abstractions;

namespace Mosaic.Wcs.Tests.Projections;

/// <summary>
/// BON and PCO (FITS WCS Paper II section 5.6) against astropy.wcs (Debian python3-astropy, wcslib inside) on
/// rotated, skewed headers, in one astropy process for the class.
/// </summary>
public sealed class PolyconicAgreementTests(ITestOutputHelper output)
{
    private static Dictionary<string, object> With(string code, double crval1, double crval2, double scale, double? theta1 = null)
    {
        var cards = Cards.Celestial(code, crval1, crval2, scale);
        if (theta1 is not null) cards["PV2_1"] = theta1.Value;
        return cards;
    }

    private static readonly (string Name, Dictionary<string, object> Cards, bool ExpectUnsolved)[] Table =
    [
        ("BON", With("BON", 120.0, 30.0, 0.05, 45.0), false),
        ("BON south", With("BON", 250.0, -60.0, 0.03, -35.0), false),
        ("BON wide", With("BON", 10.0, 5.0, 0.16, 30.0), true),       // beyond |phi| = 180 in the corners
        ("BON as SFL", With("BON", 80.0, -5.0, 0.05, 0.0), false),     // theta_1 = 0 is SFL (Paper II section 5.6.1)
        ("PCO", With("PCO", 200.0, -20.0, 0.05), false),
        ("PCO wide", With("PCO", 300.0, 40.0, 0.2), true),
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
    public void BonneNeedsItsParallel()
    {
        var error = Assert.Throws<WcsHeaderException>(() => Wcs.From(Cards.ToHeader(Cards.Celestial("BON", 10, 20))));
        Assert.Equal("PV2_1", error.Keyword);
    }
}
