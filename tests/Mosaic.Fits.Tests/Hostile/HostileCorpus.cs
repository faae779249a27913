using System.IO.Compression;
using System.Text;
using Mosaic.Fits.Tests.Support;

namespace Mosaic.Fits.Tests.Hostile;

/// <summary>
/// The malformed files, generated here byte by byte (none is committed): each name maps to its bytes. Two valid
/// files, <see cref="ValidRice"/> and <see cref="ValidRamp"/>, are the baseline the tile-compressed cases break.
/// </summary>
public static class HostileCorpus
{
    public const string ValidRice = "valid_rice_constant.fits";
    public const string ValidRamp = "valid_rice_ramp.fits";

    private const int TilePixels = 16 * 16;

    public static readonly IReadOnlyDictionary<string, Func<byte[]>> Files = new Dictionary<string, Func<byte[]>>
    {
        [ValidRice] = () => new TileTable { Streams = [RiceStreams.Constant16(7, TilePixels)] }.ToArray(),
        [ValidRamp] = () => new TileTable { Streams = [RiceStreams.Ramp16(TilePixels)] }.ToArray(),

        ["truncated_data.fits"] = () => Plain(FitsBytes.Primary(16, 100, 100)).Data(new byte[2880]).ToArray(),
        ["truncated_header.fits"] = () => Plain(FitsBytes.Primary(16, 4, 3)).ToArray()[..1000],
        ["end_missing.fits"] = () => new FitsBytes().HeaderWithoutEnd(FitsBytes.Primary(8)).PadTo(2880, (byte)' ').ToArray(),
        ["end_misplaced.fits"] = () => new FitsBytes().HeaderWithoutEnd([.. FitsBytes.Primary(8), "END", "LATE    = 1"]).PadTo(2880, (byte)' ').ToArray(),
        ["naxis_1000.fits"] = () => Plain(Mandatory(8, "1000")).ToArray(),
        ["naxis_negative.fits"] = () => Plain(Mandatory(8, "-3")).ToArray(),
        // 70000 x 70000 bytes is 4.9e9: wraps to 605032704 in 32 bits, fits in 64.
        ["naxis_product_over_32_bits.fits"] = () => Plain(FitsBytes.Primary(8, 70_000, 70_000)).Data(new byte[2880]).ToArray(),
        ["naxis_product_over_64_bits.fits"] = () => Plain(FitsBytes.Primary(-64, 1L << 31, 1L << 31, 1L << 31)).ToArray(),
        ["bitpix_24.fits"] = () => Plain(FitsBytes.Primary(24, 4, 3)).Data(new byte[36]).ToArray(),
        // 2,000 blocks of commentary before END: twice the 1,000-block cap, so refused at the cap, not read through.
        ["thousands_of_header_blocks.fits"] = () => Plain([.. FitsBytes.Primary(8), .. Enumerable.Repeat("COMMENT padding", 36 * 2000 - 4)]).ToArray(),
        ["non_ascii_header.fits"] = () => NonAscii(),
        ["duplicate_bitpix.fits"] = () => Plain([.. FitsBytes.Primary(16, 4, 3), FitsBytes.Card("BITPIX", "8".PadLeft(20))]).Data(new byte[24]).ToArray(),
        ["misordered_naxis.fits"] = () => Plain([FitsBytes.Card("SIMPLE", "T".PadLeft(20)), FitsBytes.Card("NAXIS", "0".PadLeft(20)), FitsBytes.Card("BITPIX", "8".PadLeft(20))]).ToArray(),
        // An extension type no standard defines, without the GCOUNT every extension needs to be skipped.
        ["unknown_xtension.fits"] = () => Plain(FitsBytes.Primary(8)).Header(FitsBytes.Extension("WIDGET", 8, 0, 1, 10)[..^1]).ToArray(),
        ["unknown_xtension_past_the_end.fits"] = () => Plain(FitsBytes.Primary(8)).Header(FitsBytes.Extension("WIDGET", 8, 0, 1, 100_000)).Data(new byte[10]).ToArray(),
        ["not_fits_png.fits"] = () => "\u0089PNG\r\n\u001a\n\0\0\0\rIHDR"u8.ToArray(),
        ["not_fits_text.fits"] = () => Encoding.ASCII.GetBytes(string.Concat(Enumerable.Repeat("temperature,pressure\n21.5,1013\n", 200))),

        ["tiles_vs_rows.fits"] = () => new TileTable { Axes = [32, 32], Streams = [.. Enumerable.Repeat(RiceStreams.Constant16(1, TilePixels), 3)] }.ToArray(),
        ["ztile_zero.fits"] = () => new TileTable { Tiles = [16, 0], Streams = [RiceStreams.Constant16(1, TilePixels)] }.ToArray(),
        ["znaxis_product_over_64_bits.fits"] = () => new TileTable
        {
            Axes = [int.MaxValue, int.MaxValue, int.MaxValue], Tiles = [1, 1, 1], Streams = [RiceStreams.Constant16(1, 1)],
        }.ToArray(),
        ["zbitpix_24.fits"] = () => new TileTable { ZBitPix = 24, Streams = [RiceStreams.Constant16(1, TilePixels)] }.ToArray(),
        ["heap_descriptor_outside.fits"] = () => new TileTable { Streams = [RiceStreams.Constant16(7, TilePixels)], FirstDescriptor = (6, 4096) }.ToArray(),
        ["heap_descriptor_negative.fits"] = () => new TileTable { Streams = [RiceStreams.Constant16(7, TilePixels)], FirstDescriptor = (-6, 0) }.ToArray(),
        ["theap_outside.fits"] = () => new TileTable { Streams = [RiceStreams.Constant16(7, TilePixels)], ExtraCards = [FitsBytes.Card("THEAP", "100000".PadLeft(20))] }.ToArray(),
        ["rice_trailing_bytes.fits"] = () => new TileTable { Streams = [[.. RiceStreams.Constant16(7, TilePixels), 0x12, 0x34, 0x56]] }.ToArray(),
        ["rice_missing_bytes.fits"] = () => new TileTable { Streams = [RiceStreams.Ramp16(TilePixels)[..300]] }.ToArray(),
        ["rice_cut_below_minimum.fits"] = () => new TileTable { Streams = [RiceStreams.Constant16(7, TilePixels)[..3]] }.ToArray(),
        // 3 bytes claiming a 4096 x 4096 tile of 32-bit pixels (64 MiB decoded).
        ["bomb_huge_tile.fits"] = () => new TileTable
        {
            ZBitPix = 32, Axes = [4096, 4096], Tiles = [4096, 4096], Streams = [RiceStreams.Constant16(7, 64)],
        }.ToArray(),
        // 10^5 x 10^5 pixels in tiles of 1024 x 1024 need 9,604 table rows; the file holds one.
        ["bomb_huge_image.fits"] = () => new TileTable
        {
            Axes = [100_000, 100_000], Tiles = [1024, 1024], Rows = 98 * 98, Streams = [RiceStreams.Constant16(7, 64)],
        }.ToArray(),
        // One mebibyte of zeros gzip-ed to about a kilobyte, for a tile of 512 bytes.
        ["bomb_gzip_tile.fits"] = () => new TileTable { Codec = "GZIP_1", Streams = [Gzip(new byte[1 << 20])] }.ToArray(),
        ["plio_list_longer_than_column.fits"] = () => new TileTable
        {
            Codec = "PLIO_1", ZBitPix = 16, Streams = [[0, 0, 0, 7, 0xFF, 0x9C, 0, 100, 0, 0, 0, 0, 0, 0]],
        }.ToArray(),
    };

    private static FitsBytes Plain(params string[] records) => new FitsBytes().Header(records);

    private static string[] Mandatory(int bitPix, string naxis) =>
        [FitsBytes.Card("SIMPLE", "T".PadLeft(20)), FitsBytes.Card("BITPIX", bitPix.ToString().PadLeft(20)), FitsBytes.Card("NAXIS", naxis.PadLeft(20))];

    private static byte[] NonAscii()
    {
        var bytes = Plain([.. FitsBytes.Primary(8), FitsBytes.Card("OBSERVER", "'plain text'")]).ToArray();
        bytes[3 * 80 + 13] = 0xE9; // Latin-1 e-acute inside the string value
        return bytes;
    }

    private static byte[] Gzip(byte[] data)
    {
        using var output = new MemoryStream();
        using (var gzip = new GZipStream(output, CompressionLevel.SmallestSize)) gzip.Write(data);
        return output.ToArray();
    }
}
