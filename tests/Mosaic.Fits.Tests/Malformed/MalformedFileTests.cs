using System.Text;
using Mosaic.Fits.Tests.Support;

namespace Mosaic.Fits.Tests.Malformed;

/// <summary>
/// A corpus of broken files built byte by byte. Each must give a FitsFormatException naming the HDU and keyword,
/// with a message saying what is wrong (rules from the FITS Standard 4.0, sections cited per case).
/// </summary>
public sealed class MalformedFileTests : IDisposable
{
    private readonly TempFolder _temp = new();

    public void Dispose() => _temp.Dispose();

    private static readonly byte[] SmallData = new byte[4 * 3 * 2];

    private FitsFormatException Fails(FitsBytes bytes, int? hdu, string? keyword, params string[] messageParts)
    {
        var path = bytes.WriteTo(_temp.File(Guid.NewGuid() + ".fits"));
        var e = Assert.Throws<FitsFormatException>(() => FitsFile.Open(path).Dispose());
        Assert.Equal(path, e.FilePath);
        Assert.Equal(hdu, e.HduIndex);
        Assert.Equal(keyword, e.Keyword);
        foreach (var part in messageParts) Assert.Contains(part, e.Message, StringComparison.OrdinalIgnoreCase);
        Assert.Contains(Path.GetFileName(path), e.Message);
        return e;
    }

    private string Valid() => ValidBytes().WriteTo(_temp.File(Guid.NewGuid() + ".fits"));

    private static FitsBytes ValidBytes() => new FitsBytes().Header(FitsBytes.Primary(16, 4, 3)).Data(SmallData);

    [Fact]
    public void TruncatedHeader()
    {
        // Section 3.1: a header is whole 2880-byte blocks.
        var full = ValidBytes().ToArray();
        Fails(new FitsBytes().Raw(full.AsSpan(0, 1000)), 0, "END", "truncated header");
    }

    [Fact]
    public void MissingEnd()
    {
        // Section 4.4.1: the header ends with END.
        Fails(new FitsBytes().HeaderWithoutEnd(FitsBytes.Primary(8)).PadTo(2880, (byte)' '), 0, "END", "no END");
    }

    [Fact]
    public void EndMisplaced()
    {
        // Section 4.4.1: after END the block is filled with spaces; END itself is blank in columns 9-80.
        Fails(new FitsBytes().HeaderWithoutEnd([.. FitsBytes.Primary(8), "END", "AFTER   = 1"]).PadTo(2880, (byte)' '),
            0, "END", "after END");
        Fails(new FitsBytes().HeaderWithoutEnd([.. FitsBytes.Primary(8), "END     = 1"]).PadTo(2880, (byte)' '),
            0, "END", "columns 9-80");
    }

    [Theory]
    [InlineData(24)]
    [InlineData(0)]
    [InlineData(-16)]
    public void UnsupportedBitpix(int bitPix)
    {
        // Section 4.4.1.1, table 8: 8, 16, 32, 64, -32, -64 only.
        Fails(new FitsBytes().Header(FitsBytes.Primary(bitPix)), 0, "BITPIX", "unsupported BITPIX", bitPix.ToString());
    }

    [Theory]
    [InlineData("1000")]
    [InlineData("-1")]
    public void NaxisOutOfRange(string naxis)
    {
        // Section 4.4.1.1: 0 <= NAXIS <= 999.
        Fails(new FitsBytes().Header(FitsBytes.Card("SIMPLE", "T".PadLeft(20)), FitsBytes.Card("BITPIX", "8".PadLeft(20)), FitsBytes.Card("NAXIS", naxis.PadLeft(20))),
            0, "NAXIS", naxis);
    }

    [Fact]
    public void NegativeAxisLength()
    {
        // Section 4.4.1.1: NAXISn is a non-negative integer.
        Fails(new FitsBytes().Header(FitsBytes.Primary(8, 10, -5)), 0, "NAXIS2", "negative");
    }

    [Fact]
    public void AxisProductOverflows64Bits()
    {
        Fails(new FitsBytes().Header(FitsBytes.Primary(-64, 1L << 40, 1L << 40)), 0, "NAXIS", "overflows 64 bits");
    }

    [Fact]
    public void DataLargerThanTheFile()
    {
        // Section 4.4.1.1: the data size follows from BITPIX and NAXISn; the file must hold it. No allocation
        // depends on these numbers, so a 40 GB claim costs nothing.
        var e = Fails(new FitsBytes().Header(FitsBytes.Primary(32, 100_000, 100_000)).Data(new byte[100]), 0, "NAXIS", "truncated data");
        Assert.Contains("40000000000", e.Message);
    }

    [Theory]
    [InlineData((byte)0xE9)]
    [InlineData((byte)0x09)]
    [InlineData((byte)0x00)]
    [InlineData((byte)0x7F)]
    public void NonAsciiOrControlBytesInAHeader(byte bad)
    {
        // Section 4.1.1: header bytes are restricted to 0x20-0x7E.
        var bytes = new FitsBytes().Header([.. FitsBytes.Primary(8), FitsBytes.Card("OBJNAME", "'plain'")]).ToArray();
        bytes[3 * 80 + 12] = bad;
        Fails(new FitsBytes().Raw(bytes), 0, "OBJNAME", $"0x{bad:X2}", "0x20-0x7E");
    }

    [Fact]
    public void NotAFitsFile()
    {
        // Section 4.4.1.1: the first record is SIMPLE = T.
        Fails(new FitsBytes().Raw("\u0089PNG\r\n\u001a\n"u8).PadTo(2880, 0), 0, "SIMPLE", "not a FITS file");
        Fails(new FitsBytes().Raw(Encoding.ASCII.GetBytes("just some text")), 0, "SIMPLE", "not a FITS file");
        Fails(new FitsBytes().Raw([]), 0, "SIMPLE", "not a FITS file");
        Fails(new FitsBytes().Header(FitsBytes.Card("SIMPLE", "F".PadLeft(20)), FitsBytes.Card("BITPIX", "8".PadLeft(20)), FitsBytes.Card("NAXIS", "0".PadLeft(20))),
            0, "SIMPLE", "SIMPLE = F");
    }

    [Fact]
    public void MandatoryKeywordsMissingOutOfOrderOrDuplicated()
    {
        var simple = FitsBytes.Card("SIMPLE", "T".PadLeft(20));
        var bitpix = FitsBytes.Card("BITPIX", "8".PadLeft(20));
        var naxis = FitsBytes.Card("NAXIS", "1".PadLeft(20));
        var naxis1 = FitsBytes.Card("NAXIS1", "10".PadLeft(20));
        // Section 4.4.1.1: SIMPLE, BITPIX, NAXIS, NAXIS1..n, in that order, each once.
        Fails(new FitsBytes().Header(simple, naxis, naxis1), 0, "BITPIX", "missing");
        Fails(new FitsBytes().Header(simple, naxis, bitpix, naxis1), 0, "BITPIX", "out of order");
        Fails(new FitsBytes().Header(simple, bitpix, naxis), 0, "NAXIS1", "missing");
        Fails(new FitsBytes().Header(simple, bitpix, naxis, naxis1, FitsBytes.Card("BITPIX", "16".PadLeft(20))), 0, "BITPIX", "more than once");
        Fails(new FitsBytes().Header(simple, bitpix, naxis, naxis1, FitsBytes.Card("NAXIS1", "20".PadLeft(20))), 0, "NAXIS1", "more than once");
        Fails(new FitsBytes().Header(simple, FitsBytes.Card("BITPIX", "'8'"), naxis, naxis1), 0, "BITPIX", "must be an integer");
    }

    [Fact]
    public void ExtensionMandatoryKeywords()
    {
        // Section 7.1: XTENSION, BITPIX, NAXIS, NAXISn, PCOUNT, GCOUNT.
        FitsBytes WithExtension(params string[] records) => new FitsBytes().Header(FitsBytes.Primary(8)).Header(records);
        var ext = FitsBytes.Extension("IMAGE", 8, 0, 1, 2, 2);
        Fails(WithExtension(ext[..^2]), 1, "PCOUNT", "missing");
        Fails(WithExtension([.. ext[..^2], ext[^1], ext[^2]]), 1, "PCOUNT", "out of order");
        Fails(WithExtension([FitsBytes.Card("XTENSION", "5"), .. ext[1..]]), 1, "XTENSION", "string");
        Fails(WithExtension([FitsBytes.Card("XTENSION", "''"), .. ext[1..]]), 1, "XTENSION", "non-empty");
        // Section 7.1.1: an IMAGE extension has PCOUNT = 0 and GCOUNT = 1.
        Fails(WithExtension(FitsBytes.Extension("IMAGE", 8, 4, 1, 2, 2)).Data(new byte[8]), 1, "PCOUNT", "PCOUNT = 0");
    }

    [Fact]
    public void UnknownExtensionTypesAreSkipped()
    {
        // Section 7: a conforming extension of any type can be skipped with BITPIX, NAXISn, PCOUNT and GCOUNT.
        var path = new FitsBytes()
            .Header(FitsBytes.Primary(8))
            .Header(FitsBytes.Extension("FOREIGN", 8, 100, 3, 7, 11)).Data(new byte[3 * (100 + 77)])
            .Header([.. FitsBytes.Extension("IMAGE", 16, 0, 1, 4, 3), FitsBytes.Card("EXTNAME", "'AFTER'")]).Data(SmallData)
            .WriteTo(_temp.File("foreign.fits"));
        using var file = FitsFile.Open(path);
        Assert.Equal(3, file.Hdus.Count);
        Assert.Equal("FOREIGN", file.Hdus[1].XTension);
        Assert.Null(file.Hdus[1].Image);
        Assert.Equal(3L * (100 + 77), file.Hdus[1].DataLength);
        Assert.Equal("AFTER", file.Hdus[2].ExtName);
        Assert.NotNull(file.Hdus[2].Image);
    }

    [Fact]
    public void RunawayHeadersAreCapped()
    {
        // 1,001 blocks of COMMENT records and no END: refused after the 1,000-block cap, not read to the end.
        var comments = Enumerable.Repeat("COMMENT filler", 36 * 1001 - 3).ToArray();
        Fails(new FitsBytes().HeaderWithoutEnd([.. FitsBytes.Primary(8), .. comments]), 0, "END", "1000 blocks");
    }

    [Fact]
    public void TrailingBytesAfterTheLastHduAreTolerated()
    {
        // Common practice: bytes after the last HDU that are shorter than a block, or a block that does not start
        // with XTENSION, end the file without an error.
        var shortJunk = ValidBytes().Raw(Encoding.ASCII.GetBytes("trailing junk")).WriteTo(_temp.File("short-junk.fits"));
        using (var file = FitsFile.Open(shortJunk)) Assert.Single(file.Hdus);
        var zeroBlock = ValidBytes().Raw(new byte[2880]).WriteTo(_temp.File("zero-block.fits"));
        using (var file = FitsFile.Open(zeroBlock)) Assert.Single(file.Hdus);
        // Data without the final padding (some writers omit it) are still complete.
        var unpadded = new FitsBytes().Header(FitsBytes.Primary(16, 4, 3)).Raw(SmallData).WriteTo(_temp.File("unpadded.fits"));
        using (var file = FitsFile.Open(unpadded)) Assert.Equal(4, file.Hdus[0].Image!.Width);
    }

    [Fact]
    public void AStartedExtensionMustBeComplete()
    {
        // A following block that does start with XTENSION is an HDU and is held to the standard.
        var bytes = ValidBytes().HeaderWithoutEnd(FitsBytes.Extension("IMAGE", 8, 0, 1, 2, 2)).PadTo(2880, (byte)' ');
        Fails(bytes, 1, "END", "no END");
    }

    [Fact]
    public void BadScalingKeywords()
    {
        // Section 4.4.2.5: BSCALE multiplies the stored values, so 0 is meaningless; BLANK is an integer.
        Fails(new FitsBytes().Header([.. FitsBytes.Primary(16, 4, 3), FitsBytes.Card("BSCALE", "0.0".PadLeft(20))]).Data(SmallData),
            0, "BSCALE", "BSCALE = 0");
        Fails(new FitsBytes().Header([.. FitsBytes.Primary(16, 4, 3), FitsBytes.Card("BZERO", "'big'")]).Data(SmallData),
            0, "BZERO", "finite number");
        Fails(new FitsBytes().Header([.. FitsBytes.Primary(16, 4, 3), FitsBytes.Card("BLANK", "1.5")]).Data(SmallData),
            0, "BLANK", "integer");
    }

    [Fact]
    public void UnreadableValues()
    {
        // Section 4.2: a value is a string, logical, integer, real or complex.
        Fails(new FitsBytes().Header([.. FitsBytes.Primary(8), FitsBytes.Card("WORD", "hello")]), 0, "WORD", "cannot read the value");
        Fails(new FitsBytes().Header([.. FitsBytes.Primary(8), FitsBytes.Card("OPEN", "'no closing quote")]), 0, "OPEN", "closing quote");
        Fails(new FitsBytes().Header([.. FitsBytes.Primary(8), FitsBytes.Card("EXTRA", "12 34")]), 0, "EXTRA", "after the value");
        Fails(new FitsBytes().Header([.. FitsBytes.Primary(8), FitsBytes.Card("HUGE", "1.0E999")]), 0, "HUGE", "outside the range");
        Fails(new FitsBytes().Header([.. FitsBytes.Primary(8), "BAD KEY = 1"]), 0, "BAD KEY", "embedded space");
    }
}
