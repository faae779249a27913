using System.IO.Compression;

namespace Mosaic.Fits.Compression;

/// <summary>GZIP_1 and GZIP_2 tiles (FITS 4.0 section 10.4.2): a gzip (RFC 1952) or zlib (RFC 1950) stream of known decoded size.</summary>
internal static class GzipInflater
{
    /// <summary>Inflates into exactly output.Length bytes: a stream that yields fewer or more is refused (the "more" case is a decompression bomb).</summary>
    public static void Inflate(byte[] input, int inputLength, Span<byte> output)
    {
        using var source = new MemoryStream(input, 0, inputLength, writable: false);
        // 1F 8B opens a gzip member (RFC 1952); anything else is read as a zlib stream, which some writers use.
        using Stream inflater = inputLength >= 2 && input[0] == 0x1F && input[1] == 0x8B
            ? new GZipStream(source, CompressionMode.Decompress)
            : new ZLibStream(source, CompressionMode.Decompress);
        try
        {
            var done = 0;
            while (done < output.Length)
            {
                var n = inflater.Read(output[done..]);
                if (n == 0) throw new TileDataException($"the gzip stream inflates to {done} bytes, but the tile needs {output.Length}");
                done += n;
            }
            Span<byte> probe = stackalloc byte[1];
            if (inflater.Read(probe) != 0)
                throw new TileDataException($"the gzip stream inflates to more than the tile's {output.Length} bytes");
        }
        catch (InvalidDataException e)
        {
            throw new TileDataException($"the gzip stream is corrupt: {e.Message}");
        }
    }

    /// <summary>
    /// Deflate (RFC 1951) codes at most 258 bytes in one 1-bit literal/length code plus a 1-bit distance code, so no
    /// stream inflates by more than about 1032:1 (from memory of the format's limits; 1100 leaves room). A stream
    /// shorter than this for its tile is refused before the tile's buffers exist.
    /// </summary>
    public static long MinimumStreamBytes(long decodedBytes) => decodedBytes / 1100;

    /// <summary>GZIP_2 stores the most significant bytes of all values first, then the next bytes, and so on: put them back together.</summary>
    public static void Unshuffle(ReadOnlySpan<byte> shuffled, Span<byte> bigEndian, int valueBytes)
    {
        var count = shuffled.Length / valueBytes;
        for (var b = 0; b < valueBytes; b++)
        {
            var plane = shuffled.Slice(b * count, count);
            for (var i = 0; i < count; i++) bigEndian[i * valueBytes + b] = plane[i];
        }
    }
}
