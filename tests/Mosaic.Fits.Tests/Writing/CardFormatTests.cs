using System.Numerics;
using Mosaic.Fits.Tests.Support;

namespace Mosaic.Fits.Tests.Writing;

/// <summary>The writer's card text, checked against the fixed format of the FITS Standard 4.0, section 4.2.</summary>
public sealed class CardFormatTests
{
    [Fact]
    public void MandatoryCardsComeFirstInTheStandardOrder()
    {
        var records = CardImages.OfEmptyPrimary(new HeaderCard("OBJNAME", "field A", null));
        // FITS 4.0 section 4.4.1.1: SIMPLE, BITPIX, NAXIS first; EXTEND (section 4.4.2.1) may follow. END last.
        Assert.Equal("SIMPLE  =                    T", records[0][..30]);
        Assert.Equal("BITPIX  =                    8", records[1][..30]);
        Assert.Equal("NAXIS   =                    0", records[2][..30]);
        Assert.Equal("EXTEND  =                    T", records[3][..30]);
        Assert.StartsWith("OBJNAME = 'field A '", records[4]);
        Assert.Equal("END".PadRight(80), records[^1]);
    }

    [Fact]
    public void StringsStartInColumn11AndCloseNoEarlierThanColumn20()
    {
        // FITS 4.0 section 4.2.1.1: a fixed-format string begins with a quote in column 11 and the closing quote
        // is in column 20 or later (the string padded to at least 8 characters).
        var r = CardImages.UserRecords(new HeaderCard("SHORT", "ab", null), new HeaderCard("QUOTE", "it's", "c"))[0..2];
        Assert.Equal('\'', r[0][10]);
        Assert.Equal("'ab      '", r[0][10..20]);
        Assert.Equal(' ', r[0][20]);
        // A quote inside the string is written as two quotes (section 4.2.1.1).
        Assert.Equal("QUOTE   = 'it''s   ' / c", r[1].TrimEnd());
    }

    [Fact]
    public void LogicalsAndIntegersEndInColumn30()
    {
        // FITS 4.0 sections 4.2.2 and 4.2.3: fixed-format T/F in column 30, integers right-justified in columns 11-30.
        var r = CardImages.UserRecords(
            new HeaderCard("FLAG", false, null),
            new HeaderCard("NEG", -123456789012L, "comment"),
            new HeaderCard("SMALL", 7, null));
        Assert.Equal("FLAG    =                    F", r[0].TrimEnd());
        Assert.Equal("NEG     =        -123456789012 / comment", r[1].TrimEnd());
        Assert.Equal('7', r[2][29]);
        Assert.True(r[2][10..29].Trim().Length == 0);
    }

    [Theory]
    [InlineData(0.1)]
    [InlineData(1e20)]
    [InlineData(-1e-300)]
    [InlineData(5e-324)]
    [InlineData(1.7976931348623157e308)]
    [InlineData(3.0)]
    [InlineData(-0.0)]
    [InlineData(0.30000000000000004)]
    public void RealsRoundTripAndCarryADecimalPoint(double value)
    {
        var r = CardImages.UserRecords(new HeaderCard("REAL", value, null))[0];
        var field = r[10..].Trim();
        // FITS 4.0 section 4.2.4: a real has a decimal point and, if any, an upper-case E exponent.
        Assert.Contains('.', field);
        Assert.DoesNotContain('e', field);
        // Right-justified to column 30 when it fits there (fixed format).
        if (field.Length <= 20) Assert.Equal(' ', r[30]);
        // Shortest round-trip digits: parsing gives the same double back (IEEE 754 correct rounding, common practice).
        Assert.Equal(BitConverter.DoubleToInt64Bits(value),
            BitConverter.DoubleToInt64Bits(double.Parse(field, System.Globalization.CultureInfo.InvariantCulture)));
    }

    [Fact]
    public void ComplexAndBigIntegersAndUndefinedValues()
    {
        var r = CardImages.UserRecords(
            new HeaderCard("CPLX", new Complex(1.5, -2), null),
            new HeaderCard("HUGE", BigInteger.Pow(10, 25), null),
            new HeaderCard("UNSET", null, "undefined"));
        // FITS 4.0 section 4.2.5: complex as (real, imaginary).
        Assert.Equal("(1.5, -2.0)", r[0][10..].Trim());
        Assert.Equal("1" + new string('0', 25), r[1][10..].Trim());
        // Section 4.1.2.3: a value indicator with an empty value field is an undefined value.
        Assert.Equal("UNSET   =  / undefined", r[2].TrimEnd());
    }

    [Fact]
    public void LongStringsUseContinueCards()
    {
        var value = string.Concat(Enumerable.Repeat("segment-'q' ", 15)).TrimEnd();
        var r = CardImages.UserRecords(new HeaderCard("LONGSTR", value, "the comment"));
        Assert.True(r.Length >= 3);
        // FITS 4.0 section 4.2.1.2: each continued piece ends with '&' inside the quotes; following records have
        // CONTINUE in columns 1-8, spaces in 9-10 and the next piece from column 11.
        Assert.EndsWith("&'", r[0].TrimEnd());
        foreach (var c in r[1..])
        {
            Assert.Equal("CONTINUE  '", c[..11]);
        }
        Assert.EndsWith("/ the comment", r[^1].TrimEnd());
        // No record runs past 80 characters and none splits a doubled quote.
        var pieces = r.Select(c => c[10..].TrimEnd()).Select(p => p[..p.LastIndexOf('\'')]).ToArray();
        foreach (var p in pieces) Assert.Equal(0, (p.Length - p.Replace("'", "").Length - 1) % 2);
    }

    [Fact]
    public void LongCommentaryIsSplitOverCards()
    {
        var text = new string('a', 100);
        var r = CardImages.UserRecords(new HeaderCard("HISTORY", null, text));
        // FITS 4.0 section 4.4.2.4: commentary text in columns 9-80, so at most 72 characters per card.
        Assert.Equal(2, r.Length);
        Assert.Equal("HISTORY " + new string('a', 72), r[0]);
        Assert.Equal("HISTORY " + new string('a', 28), r[1].TrimEnd());
    }

    [Theory]
    [InlineData("TOOLONGKEY", "value")]     // section 4.1.2.1: at most 8 characters
    [InlineData("lower", "value")]          // section 4.1.2.1: upper-case letters, digits, '-' and '_' only
    [InlineData("A B", "value")]
    [InlineData("OK", "caf\u00e9")]         // section 4.1.1 / 4.2.1.1: printable ASCII only
    [InlineData("OK", "tab\there")]
    public void InvalidKeywordsAndStringsAreRejected(string keyword, string value)
    {
        Assert.Throws<ArgumentException>(() => CardImages.OfEmptyPrimary(new HeaderCard(keyword, value, null)));
    }

    [Theory]
    [InlineData(double.NaN)]
    [InlineData(double.PositiveInfinity)]
    [InlineData(double.NegativeInfinity)]
    public void NonFiniteRealsAreRejected(double value)
    {
        // FITS 4.0 section 4.2.4 has no representation for NaN or infinity in a header.
        Assert.Throws<ArgumentException>(() => CardImages.OfEmptyPrimary(new HeaderCard("BAD", value, null)));
    }

    [Theory]
    [InlineData("SIMPLE")]
    [InlineData("BITPIX")]
    [InlineData("NAXIS")]
    [InlineData("NAXIS2")]
    [InlineData("EXTEND")]
    [InlineData("XTENSION")]
    [InlineData("PCOUNT")]
    [InlineData("GCOUNT")]
    [InlineData("END")]
    public void MandatoryKeywordsFromTheCallerAreRejected(string keyword)
    {
        var e = Assert.Throws<ArgumentException>(() => CardImages.OfEmptyPrimary(new HeaderCard(keyword, 1L, null)));
        Assert.Contains(keyword, e.Message);
    }

    [Fact]
    public void CardsTheReaderWouldMisreadAreRejected()
    {
        // Section 4.1.2.2: "= " in columns 9-10 makes a value card, so commentary text may not start with it.
        Assert.Throws<ArgumentException>(() => CardImages.OfEmptyPrimary(new HeaderCard("NOTE", null, "= 5") { NoValueIndicator = true }));
        Assert.Throws<ArgumentException>(() => CardImages.OfEmptyPrimary(new HeaderCard("HIERARCH", 1L, null)));
        // A keyword without a value indicator is written as commentary text from column 9.
        Assert.Equal("NOTE    free text", CardImages.UserRecords(new HeaderCard("NOTE", null, "free text") { NoValueIndicator = true })[0].TrimEnd());
    }

    [Fact]
    public void ACommentThatCannotFitIsRejectedNotTruncated()
    {
        Assert.Throws<ArgumentException>(() => CardImages.OfEmptyPrimary(new HeaderCard("NUM", 1L, new string('c', 60))));
        Assert.Throws<ArgumentException>(() => CardImages.OfEmptyPrimary(new HeaderCard("NUM", 1L, "caf\u00e9")));
    }
}
