using Xunit.Abstractions;

namespace Mosaic.Fits.Tests.Hostile;

/// <summary>
/// Every file of <see cref="HostileCorpus"/> opened and read as the server would: each must end in a
/// FitsFormatException naming the file, the HDU and the keyword, within <see cref="BoundedRun.Timeout"/>, and having
/// allocated no more than twice the file's size plus 1 MiB. Rules cited per case from the FITS Standard 4.0;
/// where astropy (Debian python3-astropy) also refuses the file, that is asserted as an outside opinion that it is broken.
/// </summary>
public sealed class HostileCorpusTests(CorpusFolder corpus, ITestOutputHelper output) : IClassFixture<CorpusFolder>
{
    /// <summary>Room for the runtime's own buffers, exception objects and the first JIT of a path (common practice).</summary>
    private const long FixedAllowance = 1L << 20;

    private FitsFormatException Rejected(string name, int hdu, string keyword, params string[] messageParts)
    {
        var path = corpus.PathOf(name);
        var length = new FileInfo(path).Length;
        var (error, allocated) = BoundedRun.Run(() => OpenAndRead(path));
        var e = Assert.IsType<FitsFormatException>(error);
        Assert.Equal(path, e.FilePath);
        Assert.Equal(hdu, e.HduIndex);
        Assert.Equal(keyword, e.Keyword);
        Assert.StartsWith($"{name}, HDU {hdu}, keyword {keyword}: ", e.Message);
        foreach (var part in messageParts) Assert.Contains(part, e.Message, StringComparison.OrdinalIgnoreCase);
        output.WriteLine($"{name}: {length} bytes, {allocated} bytes allocated to open and read");
        Assert.True(allocated <= 2 * length + FixedAllowance,
            $"{name}: {allocated} bytes allocated for a file of {length} bytes (bound {2 * length + FixedAllowance})");
        return e;
    }

    private void AstropyRefusesToo(string name) =>
        Assert.False(corpus.AstropyRefusal(name) is null, $"astropy read {name} without complaint, so the case may not be broken as intended");

    /// <summary>Everything a viewer does with a new file: parse every header, then read a row and a far pixel of each image.</summary>
    private static void OpenAndRead(string path)
    {
        using var file = FitsFile.Open(path);
        foreach (var hdu in file.Hdus)
        {
            if (hdu.Image is not { } plane) continue;
            plane.ReadRow(0, 0, new float[Math.Min(plane.Width, 4096)]);
            plane.ReadValue(plane.Width - 1, plane.Height - 1);
        }
    }

    [Fact]
    public void The_valid_baselines_read_back_as_astropy_reads_them()
    {
        // The tile-compressed cases below break these two files in one place each, so the files must be right:
        // astropy decodes them through its own RICE_1 decompressor (section 10.4.1) to the values they were written with.
        Assert.Null(corpus.AstropyRefusal(HostileCorpus.ValidRice));
        Assert.Null(corpus.AstropyRefusal(HostileCorpus.ValidRamp));
        using (var file = FitsFile.Open(corpus.PathOf(HostileCorpus.ValidRice)))
        {
            var row = new float[16];
            file.Hdus[1].Image!.ReadRow(15, 0, row);
            Assert.All(row, v => Assert.Equal(7f, v));
        }
        using (var file = FitsFile.Open(corpus.PathOf(HostileCorpus.ValidRamp)))
        {
            var plane = file.Hdus[1].Image!;
            Assert.Equal(0, plane.ReadValue(0, 0));
            Assert.Equal(16 * 3 + 5, plane.ReadValue(5, 3));
            Assert.Equal(255, plane.ReadValue(15, 15));
        }
    }

    [Fact]
    public void Truncated_data()
    {
        // Section 4.4.1.1: BITPIX and NAXISn give 20,000 data bytes; the file holds 2,880.
        Rejected("truncated_data.fits", 0, "NAXIS", "truncated data", "20000");
        AstropyRefusesToo("truncated_data.fits");
    }

    [Fact]
    public void Truncated_header()
    {
        // Section 3.1: a header is whole 2880-byte blocks; this one stops at byte 1,000.
        Rejected("truncated_header.fits", 0, "END", "truncated header");
        AstropyRefusesToo("truncated_header.fits");
    }

    [Fact]
    public void End_missing()
    {
        // Section 4.4.1: the last keyword record of a header is END.
        Rejected("end_missing.fits", 0, "END", "no END");
        AstropyRefusesToo("end_missing.fits");
    }

    [Fact]
    public void End_misplaced()
    {
        // Section 4.4.1: after END the rest of the block is spaces; a record after it is not part of any header.
        Rejected("end_misplaced.fits", 0, "END", "after END", "spaces");
    }

    [Fact]
    public void Naxis_above_999()
    {
        // Section 4.4.1.1: 0 <= NAXIS <= 999.
        Rejected("naxis_1000.fits", 0, "NAXIS", "NAXIS = 1000", "0..999");
    }

    [Fact]
    public void Naxis_negative()
    {
        Rejected("naxis_negative.fits", 0, "NAXIS", "NAXIS = -3", "negative");
    }

    [Fact]
    public void Axis_product_over_32_bits_is_not_wrapped()
    {
        // Section 4.4.1.1: Nbits = |BITPIX| x NAXIS1 x NAXIS2 = 4.9e9 bytes, beyond 32 bits. A 32-bit product would
        // wrap to 605032704 (4900000000 - 2^32); the message must carry the true size.
        var e = Rejected("naxis_product_over_32_bits.fits", 0, "NAXIS", "truncated data", "4900000000");
        Assert.DoesNotContain("605032704", e.Message);
        AstropyRefusesToo("naxis_product_over_32_bits.fits");
    }

    [Fact]
    public void Axis_product_over_64_bits()
    {
        // 8 x 2^31 x 2^31 x 2^31 = 2^96 bytes: the checked product must refuse it, not wrap to a small size.
        Rejected("naxis_product_over_64_bits.fits", 0, "NAXIS", "overflows 64 bits");
    }

    [Fact]
    public void Bitpix_outside_the_standard_set()
    {
        // Section 4.4.1.1, table 8: BITPIX is 8, 16, 32, 64, -32 or -64.
        Rejected("bitpix_24.fits", 0, "BITPIX", "BITPIX = 24");
        AstropyRefusesToo("bitpix_24.fits");
    }

    [Fact]
    public void Thousands_of_header_blocks()
    {
        // No limit in the standard (section 4.4.1 only requires END); the 1,000-block cap is this reader's, so a
        // 2,000-block header is refused at the cap with its own allocation bounded by the bytes read.
        Rejected("thousands_of_header_blocks.fits", 0, "END", "no END within 1000 blocks");
    }

    [Fact]
    public void Non_ascii_header_byte()
    {
        // Section 4.1.1: header bytes are the printable ASCII characters 0x20-0x7E.
        Rejected("non_ascii_header.fits", 0, "OBSERVER", "0xE9", "0x20-0x7E");
    }

    [Fact]
    public void Duplicate_mandatory_keyword()
    {
        // Section 4.4.1: each mandatory keyword appears once; a second BITPIX leaves the data size ambiguous.
        Rejected("duplicate_bitpix.fits", 0, "BITPIX", "more than once");
    }

    [Fact]
    public void Misordered_mandatory_keywords()
    {
        // Section 4.4.1.1: SIMPLE, BITPIX, NAXIS in that order.
        Rejected("misordered_naxis.fits", 0, "BITPIX", "out of order", "record 3", "record 2");
    }

    [Fact]
    public void Unknown_xtension_without_gcount()
    {
        // Section 7.1: a reader skips an extension of unknown type using BITPIX, NAXISn, PCOUNT and GCOUNT, so all
        // must be there; without GCOUNT its size is unknown.
        Rejected("unknown_xtension.fits", 1, "GCOUNT", "missing");
        AstropyRefusesToo("unknown_xtension.fits");
    }

    [Fact]
    public void Unknown_xtension_claiming_more_data_than_the_file()
    {
        Rejected("unknown_xtension_past_the_end.fits", 1, "NAXIS", "truncated data", "100000");
    }

    [Fact]
    public void Not_fits_at_all()
    {
        // Section 4.4.1.1: a FITS file begins with SIMPLE = T.
        Rejected("not_fits_png.fits", 0, "SIMPLE", "not a FITS file");
        Rejected("not_fits_text.fits", 0, "SIMPLE", "not a FITS file");
        AstropyRefusesToo("not_fits_png.fits");
        AstropyRefusesToo("not_fits_text.fits");
    }

    [Fact]
    public void Tile_count_disagreeing_with_the_table_rows()
    {
        // Section 10.1: one table row per tile; 32 x 32 in tiles of 16 x 16 are 4 tiles, the table has 3 rows.
        Rejected("tiles_vs_rows.fits", 1, "ZTILE1", "4 tiles", "NAXIS2 = 3");
    }

    [Fact]
    public void Tile_size_zero()
    {
        // Section 10.1.1: ZTILEn is a positive tile length.
        Rejected("ztile_zero.fits", 1, "ZTILE2", "ZTILE2 = 0", "at least 1");
    }

    [Fact]
    public void Compressed_axis_product_over_64_bits()
    {
        // Section 10.1.1: ZNAXISn of the original image; (2^31 - 1)^3 tiles of one pixel overflow 64 bits.
        Rejected("znaxis_product_over_64_bits.fits", 1, "ZTILE1", "overflows 64 bits");
    }

    [Fact]
    public void Compressed_bitpix_outside_the_standard_set()
    {
        // Section 10.1.1: ZBITPIX takes the values of BITPIX.
        Rejected("zbitpix_24.fits", 1, "ZBITPIX", "ZBITPIX = 24");
    }

    [Fact]
    public void Heap_descriptor_outside_the_heap()
    {
        // Section 7.3.5: a descriptor's offset and count address bytes inside the heap (here 6 bytes long).
        Rejected("heap_descriptor_outside.fits", 1, "TFORM1", "outside the heap", "4096");
        AstropyRefusesToo("heap_descriptor_outside.fits");
    }

    [Fact]
    public void Heap_descriptor_with_a_negative_count()
    {
        Rejected("heap_descriptor_negative.fits", 1, "TFORM1", "negative count");
    }

    [Fact]
    public void Heap_start_outside_the_data()
    {
        // Section 7.3.5: THEAP is the heap's offset from the start of the data and lies within them.
        Rejected("theap_outside.fits", 1, "THEAP", "THEAP = 100000");
    }

    [Fact]
    public void Rice_stream_with_trailing_bytes()
    {
        // Section 10.4.1: the stream codes exactly the tile's pixels; three more bytes are another stream's, or garbage.
        Rejected("rice_trailing_bytes.fits", 1, "ZCMPTYPE", "RICE_1", "3 bytes after the tile's last value");
    }

    [Fact]
    public void Rice_stream_with_missing_bytes()
    {
        // Section 10.4.1: 8 plainly stored blocks need 518 bytes; 300 run out in the fifth block. Missing codes
        // are an error, never zeros.
        Rejected("rice_missing_bytes.fits", 1, "ZCMPTYPE", "RICE_1 stream ends before the tile is complete");
        AstropyRefusesToo("rice_missing_bytes.fits");
    }

    [Fact]
    public void Rice_stream_cut_below_its_minimum()
    {
        // 256 pixels in blocks of 32 need the 2-byte first value and 8 four-bit fields: 6 bytes at least.
        Rejected("rice_cut_below_minimum.fits", 1, "ZCMPTYPE", "3 compressed bytes", "at least 6");
    }

    [Fact]
    public void Decompression_bomb_a_tiny_file_claiming_a_huge_tile()
    {
        // A 4096 x 4096 tile of 32-bit pixels is 64 MiB; its RICE_1 stream needs 327,684 bytes at least (one 5-bit
        // field per block of 32, section 10.4.1). The 3 bytes given are refused before the tile is allocated: the
        // allocation bound of Rejected (2 x 8640 bytes + 1 MiB) fails if the 64 MiB buffer is ever made.
        Rejected("bomb_huge_tile.fits", 1, "ZCMPTYPE", "cannot code a tile of 16777216 pixels", "327684");
    }

    [Fact]
    public void Decompression_bomb_a_tiny_file_claiming_a_huge_image()
    {
        // 10^5 x 10^5 pixels in 1024 x 1024 tiles need 98 x 98 rows of 8 bytes (section 10.1), 76,835 data bytes with the 3-byte heap: more than the file holds.
        Rejected("bomb_huge_image.fits", 1, "NAXIS", "truncated data", "76835");
    }

    [Fact]
    public void Decompression_bomb_a_gzip_tile_inflating_beyond_its_tile()
    {
        // Section 10.4.2: a GZIP_1 tile inflates to the tile's 16 x 16 x 2 bytes; this one holds 1 MiB. Inflating
        // stops one byte past the tile, so the allocation stays near the file size.
        Rejected("bomb_gzip_tile.fits", 1, "ZCMPTYPE", "more than the tile's 512 bytes");
    }

    [Fact]
    public void Plio_line_list_longer_than_its_column()
    {
        // Section 10.4.3: the line list's header gives its own length (100 words); the column holds 7.
        Rejected("plio_list_longer_than_column.fits", 1, "ZCMPTYPE", "PLIO_1", "list of 100 words");
    }
}
