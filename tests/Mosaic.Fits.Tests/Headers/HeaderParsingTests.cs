using System.Numerics;
using Mosaic.Fits.Tests.Support;

namespace Mosaic.Fits.Tests.Headers;

/// <summary>
/// Keyword records parsed by the reader, checked against the rules and examples of the FITS Standard 4.0, section 4.
/// Examples marked "from memory" are recalled from the standard's text, not copied from it.
/// </summary>
public sealed class HeaderParsingTests : IDisposable
{
    private readonly TempFolder _temp = new();

    public void Dispose() => _temp.Dispose();

    private Header Parse(params string[] records)
    {
        var path = new FitsBytes().Header([.. FitsBytes.Primary(8), .. records]).WriteTo(_temp.File(Guid.NewGuid() + ".fits"));
        using var file = FitsFile.Open(path);
        return file.Hdus[0].Header;
    }

    [Fact]
    public void Strings_DoubledQuotesLeadingAndTrailingSpaces()
    {
        // Section 4.2.1.1: a quote inside a string is two successive quotes (the standard's example is O'HARA,
        // from memory); leading spaces are significant, trailing spaces are not.
        var h = Parse(
            FitsBytes.Card("NAME", "'O''HARA'"),
            FitsBytes.Card("LEAD", "'   indented' / c"),
            FitsBytes.Card("TRAIL", "'text      '"),
            FitsBytes.Card("NULLSTR", "''"),
            FitsBytes.Card("SLASH", "'a/b' / the slash inside quotes is text"));
        Assert.Equal("O'HARA", h.GetString("NAME"));
        Assert.Equal("   indented", h.GetString("LEAD"));
        Assert.Equal("c", h.Find("LEAD")!.Comment);
        Assert.Equal("text", h.GetString("TRAIL"));
        Assert.Equal("", h.GetString("NULLSTR"));
        Assert.Equal("a/b", h.GetString("SLASH"));
        Assert.Equal("the slash inside quotes is text", h.Find("SLASH")!.Comment);
    }

    [Fact]
    public void Continue_JoinsPiecesEndingInAmpersand()
    {
        // Section 4.2.1.2, the standard's own example (from memory).
        var h = Parse(
            "WEATHER = 'Partly cloudy during the evening f&'",
            "CONTINUE  'ollowed by cloudy skies overnight.&'",
            "CONTINUE  ' Low 21C. Winds NNE at 5 to 10 mph.'");
        Assert.Equal("Partly cloudy during the evening followed by cloudy skies overnight. Low 21C. Winds NNE at 5 to 10 mph.",
            h.GetString("WEATHER"));
        Assert.Single(h.Cards, c => c.Keyword == "WEATHER");
        Assert.DoesNotContain(h.Cards, c => c.Keyword == "CONTINUE");
    }

    [Fact]
    public void Continue_AmpersandRulesAndComments()
    {
        var h = Parse(
            // Section 4.2.1.2: only an '&' as the last character of the string announces a CONTINUE...
            "INSIDE  = 'a & b&'",
            "CONTINUE  ' c''d' / end comment",
            // ...and an '&' not followed by CONTINUE is an ordinary character.
            "ALONE   = 'ends with &'",
            "OTHER   = 1",
            // A CONTINUE after a string without '&' continues nothing: kept as commentary, not joined.
            "PLAIN   = 'done'",
            "CONTINUE  'stray'");
        Assert.Equal("a & b c'd", h.GetString("INSIDE"));
        Assert.Equal("end comment", h.Find("INSIDE")!.Comment);
        Assert.Equal("ends with &", h.GetString("ALONE"));
        Assert.Equal("done", h.GetString("PLAIN"));
        var stray = Assert.Single(h.Cards, c => c.Keyword == "CONTINUE");
        Assert.True(stray.IsCommentary);
    }

    [Fact]
    public void Logicals()
    {
        // Section 4.2.2: T or F, in column 30 in fixed format, anywhere after the indicator in free format.
        var h = Parse(FitsBytes.Card("FIXED", "T".PadLeft(20)), FitsBytes.Card("FREE", " F / free format"));
        Assert.True(h.GetBool("FIXED"));
        Assert.False(h.GetBool("FREE"));
        Assert.Equal("free format", h.Find("FREE")!.Comment);
    }

    [Fact]
    public void Integers_BeyondThirtyTwoAndSixtyFourBits()
    {
        // Section 4.2.3: an integer is a sequence of digits with an optional sign; the standard sets no upper size.
        var h = Parse(
            FitsBytes.Card("BIG", "9223372036854775807".PadLeft(20)),
            FitsBytes.Card("NEG", "-9223372036854775808".PadLeft(20)),
            FitsBytes.Card("BEYOND", "  18446744073709551616"),
            FitsBytes.Card("PLUS", "+0042 / leading zeros and sign"));
        Assert.Equal(long.MaxValue, h.GetLong("BIG"));
        Assert.Equal(long.MinValue, h.GetLong("NEG"));
        Assert.Equal(BigInteger.Pow(2, 64), h.Find("BEYOND")!.Value);
        Assert.Null(h.GetLong("BEYOND"));
        Assert.Equal(Math.Pow(2, 64), h.GetDouble("BEYOND"));
        Assert.Equal(42L, h.Find("PLUS")!.Value);
    }

    [Fact]
    public void Reals_WithEAndDExponents()
    {
        // Section 4.2.4: a decimal number with an optional exponent introduced by E or D.
        var h = Parse(
            FitsBytes.Card("R1", "1.0E-3".PadLeft(20)),
            FitsBytes.Card("R2", "-1.5D+02".PadLeft(20)),
            FitsBytes.Card("R3", ".5"),
            FitsBytes.Card("R4", "6.02E23"),
            FitsBytes.Card("R5", "12."),
            FitsBytes.Card("R6", "1.2345678901234567890123D-300"));
        Assert.Equal(1.0e-3, h.Find("R1")!.Value);
        Assert.Equal(-150.0, h.Find("R2")!.Value);
        Assert.Equal(0.5, h.Find("R3")!.Value);
        Assert.Equal(6.02e23, h.Find("R4")!.Value);
        Assert.Equal(12.0, h.Find("R5")!.Value);
        // Correct rounding of a long decimal (IEEE 754, common practice).
        Assert.Equal(1.2345678901234567890123e-300, h.Find("R6")!.Value);
    }

    [Fact]
    public void ComplexValues()
    {
        // Sections 4.2.5 and 4.2.6: complex integer and complex real, "(real, imaginary)".
        var h = Parse(FitsBytes.Card("CI", "(3, -4)"), FitsBytes.Card("CR", "(1.5E0, 2.0D1) / complex real"));
        Assert.Equal(new Complex(3, -4), h.Find("CI")!.Value);
        Assert.Equal(new Complex(1.5, 20), h.Find("CR")!.Value);
        Assert.Equal("complex real", h.Find("CR")!.Comment);
    }

    [Fact]
    public void UndefinedValuesAreNotCommentary()
    {
        // Section 4.1.2.3: a value indicator followed by nothing (or only a comment) is an undefined value.
        var h = Parse("EMPTY   =", FitsBytes.Card("WITHCOM", "              / only a comment"));
        var empty = h.Find("EMPTY")!;
        Assert.Null(empty.Value);
        Assert.False(empty.IsCommentary);
        Assert.Null(empty.Comment);
        Assert.Equal("only a comment", h.Find("WITHCOM")!.Comment);
        Assert.True(h.Contains("WITHCOM"));
    }

    [Fact]
    public void CommentaryKeywords()
    {
        // Section 4.4.2.4: COMMENT, HISTORY and the blank keyword carry text in columns 9-80; section 4.1.2.2:
        // without "= " in columns 9-10 any keyword's record is commentary.
        var h = Parse(
            "COMMENT   free text, even = signs and 'quotes'",
            "HISTORY step 1",
            "        blank keyword",
            "NOTE      no value indicator here");
        var comment = h.Cards.Single(c => c.Keyword == "COMMENT");
        Assert.True(comment.IsCommentary);
        Assert.Equal("  free text, even = signs and 'quotes'", comment.Comment);
        Assert.Equal("step 1", h.Cards.Single(c => c.Keyword == "HISTORY").Comment);
        Assert.Equal("blank keyword", h.Cards.Single(c => c.Keyword == "").Comment);
        var note = h.Cards.Single(c => c.Keyword == "NOTE");
        Assert.True(note.IsCommentary);
        Assert.False(h.Contains("NOTE"));
        Assert.False(h.Contains("COMMENT"));
    }

    [Fact]
    public void HierarchCardsAreStoredUnderTheirWords()
    {
        // The HIERARCH convention (a registered FITS convention, not part of the standard itself): the words
        // between HIERARCH and '=' form the keyword. Mosaic joins them with single spaces.
        var h = Parse(
            "HIERARCH MOSAIC CAMERA  GAIN = 2.5 / e-/ADU",
            "HIERARCH MOSAIC FILTER = 'wide red'",
            "HIERARCH no equals sign is commentary");
        Assert.Equal(2.5, h.GetDouble("MOSAIC CAMERA GAIN"));
        Assert.Equal("e-/ADU", h.Find("MOSAIC CAMERA GAIN")!.Comment);
        Assert.Equal("wide red", h.GetString("MOSAIC FILTER"));
        Assert.True(h.Cards.Single(c => c.Keyword == "HIERARCH").IsCommentary);
    }

    [Fact]
    public void CommentsFollowASlash()
    {
        // Section 4.1.2.3: a '/' after the value starts the comment; a space before it is customary, not required.
        var h = Parse(FitsBytes.Card("TIGHT", "5/no space"), FitsBytes.Card("NOCOM", "5"));
        Assert.Equal(5L, h.Find("TIGHT")!.Value);
        Assert.Equal("no space", h.Find("TIGHT")!.Comment);
        Assert.Null(h.Find("NOCOM")!.Comment);
    }

    [Fact]
    public void LastOccurrenceWinsAndHeadersSpanBlocks()
    {
        // 40 records and END need a second 2880-byte block (section 4.4.1: 36 records per block).
        var records = Enumerable.Range(0, 40).Select(i => FitsBytes.Card("REPEAT", i.ToString().PadLeft(20))).ToArray();
        var h = Parse(records);
        Assert.Equal(39L, h.GetLong("REPEAT"));
        Assert.Equal(43, h.Cards.Count);
    }

    [Fact]
    public void FreeFormatValuesAndLowerCaseKeywordsAreTolerated()
    {
        // Free format (section 4.2): values anywhere in columns 11-80. Lower-case keyword letters break section
        // 4.1.2.1 but are kept as written (common practice: readers tolerate them).
        var h = Parse("FAR     =                                         77 / far right", "lowkey  = 1");
        Assert.Equal(77L, h.GetLong("FAR"));
        Assert.Equal(1L, h.GetLong("lowkey"));
    }
}
