using Microsoft.Win32.SafeHandles;
using Mosaic.Fits.Compression;

namespace Mosaic.Fits.Parsing;

/// <summary>A BINTABLE with ZIMAGE = T (FITS 4.0 section 10.1): its restored image header, and its plane where this reader decodes the codec.</summary>
internal static class CompressedImageReader
{
    public static bool IsCompressedImage(Header header) =>
        header.GetString("XTENSION")?.TrimEnd() == "BINTABLE" && header.GetBool("ZIMAGE") == true;

    public static Hdu Read(int index, Header stored, HduLayout table, SafeFileHandle handle, long headerOffset, long dataOffset, in ParseContext context)
    {
        var layout = CompressedImageLayout.Parse(stored, table, context);
        if (layout is null) return new Hdu(index, stored, headerOffset, dataOffset, table.DataLength, null);
        var restored = ImageHeaderRestorer.Restore(stored, layout);

        if (layout.Codec is TileCodec.HCompress)
        {
            var problem =
                $"{Path.GetFileName(context.FilePath)}, HDU {index}: tile compression {layout.CodecName} is not supported by this reader (RICE_1, GZIP_1, GZIP_2, PLIO_1 and NOCOMPRESS are)";
            return new Hdu(index, restored, headerOffset, dataOffset, table.DataLength, null, stored, problem);
        }

        var bScale = Real(restored, "BSCALE", 1.0, context);
        if (bScale == 0) throw context.Error("BSCALE", "BSCALE = 0 would make every pixel equal to BZERO (section 4.4.2.5)");
        var bZero = Real(restored, "BZERO", 0.0, context);
        var entries = TileIndex.Read(handle, dataOffset, layout, context);
        var plane = new TiledImagePlane(handle, context.FilePath, index, layout, entries, bScale, bZero);
        return new Hdu(index, restored, headerOffset, dataOffset, table.DataLength, plane, stored);
    }

    private static double Real(Header header, string keyword, double fallback, in ParseContext context)
    {
        if (!header.Contains(keyword)) return fallback;
        var value = header.GetDouble(keyword);
        if (value is not double d || !double.IsFinite(d))
            throw context.Error(keyword, $"{keyword} must be a finite number (section 4.4.2.5)");
        return d;
    }
}
