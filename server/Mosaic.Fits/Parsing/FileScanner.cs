using Microsoft.Win32.SafeHandles;

namespace Mosaic.Fits.Parsing;

/// <summary>Walks the HDUs of a file: header, data size, padding, next header (FITS 4.0 sections 3.3 and 7).</summary>
internal static class FileScanner
{
    private const int BlockSize = HeaderReader.BlockSize;

    /// <summary>More HDUs than this is refused: far beyond any camera frame, and it bounds the work of a crafted file.</summary>
    public const int MaxHdus = 10_000;

    /// <remarks>
    /// After the last HDU, fewer than 2880 bytes, or a block that does not start with "XTENSION", end the walk without
    /// an error (common practice: some writers leave padding or trailing bytes). A block that does start with XTENSION
    /// is parsed strictly.
    /// </remarks>
    public static List<Hdu> Scan(SafeFileHandle handle, string path, long fileLength)
    {
        var hdus = new List<Hdu>();
        if (!StartsWith(handle, 0, fileLength, "SIMPLE  = "))
            throw new FitsFormatException(path, 0, "SIMPLE",
                "not a FITS file: the first record must be SIMPLE = T (section 4.4.1.1)");

        long offset = 0;
        while (true)
        {
            var index = hdus.Count;
            if (index == MaxHdus)
                throw new FitsFormatException(path, index, "XTENSION", $"the file has more than {MaxHdus} HDUs; refusing to read further");
            var context = new ParseContext(path, index);
            var (header, headerLength) = HeaderReader.Read(handle, offset, fileLength, context);
            var layout = MandatoryKeywords.Check(header, primary: index == 0, context);

            var dataOffset = offset + headerLength;
            var available = fileLength - dataOffset;
            if (layout.DataLength > available)
                throw context.Error("NAXIS",
                    $"truncated data: BITPIX, NAXISn, PCOUNT and GCOUNT declare {layout.DataLength} data bytes but only {available} remain in the file (section 4.4.1.1)");

            if (CompressedImageReader.IsCompressedImage(header))
                hdus.Add(CompressedImageReader.Read(index, header, layout, handle, offset, dataOffset, context));
            else
                hdus.Add(new Hdu(index, header, offset, dataOffset, layout.DataLength, ImageKeywords.PlaneOf(layout, header, handle, dataOffset, context)));

            // A missing final padding is tolerated: the data themselves are all there.
            var padded = (layout.DataLength + BlockSize - 1) / BlockSize * BlockSize;
            offset = dataOffset + padded;
            if (fileLength - offset < BlockSize) break;
            if (!StartsWith(handle, offset, fileLength, "XTENSION")) break;
        }
        return hdus;
    }

    private static bool StartsWith(SafeFileHandle handle, long offset, long fileLength, string prefix)
    {
        if (fileLength - offset < prefix.Length) return false;
        Span<byte> head = stackalloc byte[prefix.Length];
        var done = 0;
        while (done < head.Length)
        {
            var n = RandomAccess.Read(handle, head[done..], offset + done);
            if (n == 0) return false;
            done += n;
        }
        for (var i = 0; i < prefix.Length; i++)
            if (head[i] != prefix[i]) return false;
        return true;
    }
}
