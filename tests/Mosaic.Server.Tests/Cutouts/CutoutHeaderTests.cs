using Mosaic.Fits;
using Mosaic.Server.Cutouts;

namespace Mosaic.Server.Tests.Cutouts;

/// <summary>The cutout header's WCS shift in the cases the fixture files do not hold, by the rules of WCS Paper I.</summary>
public sealed class CutoutHeaderTests
{
    private static readonly DateTime Now = new(2026, 3, 4, 5, 6, 7, DateTimeKind.Utc);

    private static List<HeaderCard> Build(params HeaderCard[] cards) =>
        CutoutHeader.Build(new Header(cards), "CHIPX", 11, 21, physicalFloats: false, ["cut"], unit: null, Now);

    private static double Value(List<HeaderCard> cards, string keyword) => Convert.ToDouble(cards.Single(c => c.Keyword == keyword).Value);

    [Fact]
    public void AlternateDescriptionsShiftLikeThePrimaryOne()
    {
        // WCS Paper I section 2.1.2 and 3.3: CRPIXja of every alternate description a = A..Z is a pixel coordinate too.
        var cards = Build(new HeaderCard("CTYPE1", "RA---TAN", null), new HeaderCard("CTYPE2", "DEC--TAN", null),
            new HeaderCard("CRPIX1", 100.25, null), new HeaderCard("CRPIX2", 50L, null),
            new HeaderCard("CRPIX1A", 7.5, null), new HeaderCard("CRPIX2A", -3.0, null));
        Assert.Equal(90.25, Value(cards, "CRPIX1"));
        Assert.Equal(30.0, Value(cards, "CRPIX2"));
        Assert.Equal(-2.5, Value(cards, "CRPIX1A"));
        Assert.Equal(-23.0, Value(cards, "CRPIX2A"));
    }

    [Fact]
    public void AMissingCrpixIsWrittenShiftedFromItsDefaultOfZero()
    {
        // WCS Paper I section 2.1.2: CRPIXj defaults to 0.
        var cards = Build(new HeaderCard("CTYPE1", "RA---TAN", null), new HeaderCard("CTYPE2", "DEC--TAN", null));
        Assert.Equal(-10.0, Value(cards, "CRPIX1"));
        Assert.Equal(-20.0, Value(cards, "CRPIX2"));
        // Without a WCS nothing is invented.
        Assert.DoesNotContain(Build(new HeaderCard("OBJECT", "x", null)), c => c.Keyword.StartsWith("CRPIX", StringComparison.Ordinal));
    }

    [Fact]
    public void StructureAndStaleCardsGoAndTheCutoutsOwnCome()
    {
        var cards = Build(new HeaderCard("XTENSION", "IMAGE", null), new HeaderCard("BITPIX", 16L, null), new HeaderCard("NAXIS", 2L, null),
            new HeaderCard("NAXIS1", 5L, null), new HeaderCard("PCOUNT", 0L, null), new HeaderCard("CHECKSUM", "abc", null),
            new HeaderCard("ZQUANTIZ", "NO_DITHER", null), new HeaderCard("DATE", "2001-01-01", null), new HeaderCard("BZERO", 32768L, null),
            new HeaderCard("ZEROPT", 25.1, "kept: not a compression keyword"));
        var keys = cards.Select(c => c.Keyword).ToList();
        Assert.DoesNotContain("XTENSION", keys);
        Assert.DoesNotContain("NAXIS1", keys);
        Assert.DoesNotContain("CHECKSUM", keys);
        Assert.DoesNotContain("ZQUANTIZ", keys);
        Assert.Contains("ZEROPT", keys);
        Assert.Contains("BZERO", keys);
        Assert.Equal("2026-03-04T05:06:07", cards.Single(c => c.Keyword == "DATE").Value);   // FITS 4.0 section 4.4.2.1 form
        Assert.Equal("CHIPX", cards.Single(c => c.Keyword == "EXTNAME").Value);
        Assert.Equal("cut", cards.Single(c => c.Keyword == "HISTORY").Comment);
    }
}
