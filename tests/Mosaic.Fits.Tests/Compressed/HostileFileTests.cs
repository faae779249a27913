using Mosaic.Fits.Tests.Support;

namespace Mosaic.Fits.Tests.Compressed;

/// <summary>
/// fpack files with one thing broken. Each must give a FitsFormatException naming the file, the HDU and the keyword,
/// at open (header and descriptor problems) or at the first read of the tile (stream problems); rules from FITS 4.0
/// sections 7.3.5 and 10 as cited per case.
/// </summary>
[Collection(FpackCollection.Name)]
public sealed class HostileFileTests(FpackReferenceFiles files) : IDisposable
{
    private readonly TempFolder _temp = new();

    public void Dispose() => _temp.Dispose();

    private string Write(PatchedFile file) => file.WriteTo(_temp.File(Guid.NewGuid().ToString("N") + ".fz"));

    private FitsFormatException FailsAtOpen(PatchedFile file, string keyword, params string[] messageParts)
    {
        var path = Write(file);
        var e = Assert.Throws<FitsFormatException>(() => FitsFile.Open(path).Dispose());
        Check(e, path, keyword, messageParts);
        return e;
    }

    private void FailsOnRead(PatchedFile file, string? keyword, params string[] messageParts)
    {
        var path = Write(file);
        using var fits = FitsFile.Open(path);
        var plane = fits.Hdus[1].Image!;
        var e = Assert.Throws<FitsFormatException>(() => plane.ReadRows(0, 1, new float[plane.Width]));
        Check(e, path, keyword, messageParts);
        // The plane stays usable for the caller's error path: the same read fails the same way, it does not hang or crash.
        Assert.Throws<FitsFormatException>(() => plane.ReadValue(0, 0));
    }

    private static void Check(FitsFormatException e, string path, string? keyword, string[] messageParts)
    {
        Assert.Equal(path, e.FilePath);
        Assert.Equal(1, e.HduIndex);
        Assert.Equal(keyword, e.Keyword);
        Assert.Contains(Path.GetFileName(path), e.Message);
        foreach (var part in messageParts) Assert.Contains(part, e.Message, StringComparison.OrdinalIgnoreCase);
    }

    private PatchedFile Rice16() => PatchedFile.Of(files.PathOf("i16_rice"));

    [Fact]
    public void UnknownCompressionType()
    {
        // Section 10.4: ZCMPTYPE names one of the defined algorithms.
        FailsAtOpen(Rice16().Card("ZCMPTYPE", "'SQUASH_9'"), "ZCMPTYPE", "unknown ZCMPTYPE", "SQUASH_9");
    }

    [Fact]
    public void UnknownQuantisation()
    {
        // Section 10.2: ZQUANTIZ is NO_DITHER, SUBTRACTIVE_DITHER_1 or SUBTRACTIVE_DITHER_2.
        FailsAtOpen(PatchedFile.Of(files.PathOf("f32_dither1")).Card("ZQUANTIZ", "'WOBBLE_DITHER_1'"), "ZQUANTIZ", "unknown ZQUANTIZ", "WOBBLE_DITHER_1");
    }

    [Fact]
    public void DitherSeedOutOfRange()
    {
        // Section 10.2.1: ZDITHER0 is 1..10000, an index into the random sequence.
        FailsAtOpen(PatchedFile.Of(files.PathOf("f32_dither1")).Card("ZDITHER0", "0".PadLeft(20)), "ZDITHER0", "1..10000");
    }

    [Fact]
    public void TilingThatDoesNotMatchTheRowCount()
    {
        // Section 10.1: one table row per tile; 37 image rows in tiles of 2 rows are 19 tiles, not the 37 rows there are.
        FailsAtOpen(Rice16().Card("ZTILE2", "2".PadLeft(20)), "ZTILE1", "19 tiles", "NAXIS2 = 37");
    }

    [Fact]
    public void ZeroTileSize()
    {
        // Section 10.1.1: ZTILEn is a positive length.
        FailsAtOpen(Rice16().Card("ZTILE1", "0".PadLeft(20)), "ZTILE1", "at least 1");
    }

    [Fact]
    public void TileTooLargeToDecode()
    {
        // A tile of 2^30 pixels would need gigabytes to decode: refused at open.
        FailsAtOpen(Rice16().Card("ZNAXIS1", "1073741824".PadLeft(20)).Card("ZTILE1", "1073741824".PadLeft(20)), "ZTILE1", "larger than this reader decodes");
    }

    [Fact]
    public void UnsupportedOriginalBitpix()
    {
        // Section 10.1.1: ZBITPIX takes the values of BITPIX (section 4.4.1.1).
        FailsAtOpen(Rice16().Card("ZBITPIX", "24".PadLeft(20)), "ZBITPIX", "ZBITPIX = 24");
    }

    [Fact]
    public void DataColumnThatIsNotAVariableLengthArray()
    {
        // Section 10.1.2: COMPRESSED_DATA is a 1P or 1Q variable-length array column.
        FailsAtOpen(Rice16().Card("TFORM1", "'8B      '"), "TFORM1", "variable-length");
    }

    [Fact]
    public void DescriptorOutsideTheHeap()
    {
        // Section 7.3.5: a descriptor addresses bytes inside the heap.
        FailsAtOpen(Rice16().FirstDescriptorOffset(1_000_000), "TFORM1", "outside the heap");
    }

    [Fact]
    public void GzipStreamLongerThanTheTile()
    {
        // Section 10.1: a tile has ZTILE1 x ZTILE2 pixels; a stream inflating to more is refused (a decompression bomb).
        FailsOnRead(PatchedFile.Of(files.PathOf("i16_gzip1")).Card("ZNAXIS1", "50".PadLeft(20)).Card("ZTILE1", "50".PadLeft(20)),
            "ZCMPTYPE", "more than the tile's 100 bytes");
    }

    [Fact]
    public void GzipStreamShorterThanTheTile()
    {
        FailsOnRead(PatchedFile.Of(files.PathOf("i16_gzip1")).Card("ZNAXIS1", "60".PadLeft(20)).Card("ZTILE1", "60".PadLeft(20)),
            "ZCMPTYPE", "inflates to 106 bytes", "needs 120");
    }

    [Fact]
    public void RiceStreamShorterThanTheTile()
    {
        // Section 10.4.1: the stream codes every pixel of the tile; running out first is an error, not zeros.
        FailsOnRead(Rice16().Card("ZNAXIS1", "4000".PadLeft(20)).Card("ZTILE1", "4000".PadLeft(20)), "ZCMPTYPE", "cannot code a tile of 4000 pixels", "RICE_1 needs at least");
    }

    [Fact]
    public void HCompressStreamForAnotherTileSize()
    {
        // Section 10.4.4: the stream records the tile's size; one that disagrees with ZTILEn is refused.
        FailsOnRead(PatchedFile.Of(files.PathOf("i16_hcompress")).Card("ZNAXIS1", "50".PadLeft(20)).Card("ZTILE1", "50".PadLeft(20)),
            "ZCMPTYPE", "HCOMPRESS_1 stream holds 16 x 53 values", "16 x 50");
    }

    [Fact]
    public void CorruptGzipStream()
    {
        FailsOnRead(PatchedFile.Of(files.PathOf("i16_gzip1")).CorruptFirstTile(), "ZCMPTYPE", "gzip");
    }

    [Fact]
    public void SmoothingOnDecompressionIsRefusedWithTheReason()
    {
        // HCOMPRESS_1 SMOOTH = 1 (section 10.4.4) asks the reader to smooth: the HDU is listed, without an image, with the reason.
        var path = Write(PatchedFile.Of(files.PathOf("i16_hcompress")).Card("ZVAL2", "1".PadLeft(20)));
        using var fits = FitsFile.Open(path);
        var hdu = fits.Hdus[1];
        Assert.Null(hdu.Image);
        Assert.Contains("HCOMPRESS_1", hdu.ImageProblem);
        Assert.Contains("SMOOTH", hdu.ImageProblem);
        Assert.Equal(2, hdu.Header.GetLong("NAXIS"));
    }
}
