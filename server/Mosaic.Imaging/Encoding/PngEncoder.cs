using System.Buffers;
using System.Buffers.Binary;
using System.IO.Compression;

namespace Mosaic.Imaging.Encoding;

/// <summary>
/// Minimal, fast PNG writer for tiles (PNG specification, W3C 2003 / ISO 15948; RFC 2083): signature, IHDR, one
/// IDAT, IEND; 8-bit gray (colour type 0) or gray + alpha (type 4); filter type 0 on every row, no interlace.
/// </summary>
public static class PngEncoder
{
    private const byte ColorTypeGray = 0;
    private const byte ColorTypeGrayAlpha = 4;
    private static ReadOnlySpan<byte> Signature => [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A];
    private static ReadOnlySpan<byte> Ihdr => "IHDR"u8;
    private static ReadOnlySpan<byte> Idat => "IDAT"u8;
    private static ReadOnlySpan<byte> Iend => "IEND"u8;

    public static byte[] EncodeGray(ReadOnlySpan<byte> pixels, int width, int height)
        => Encode(pixels, width, height, ColorTypeGray, PngCompression.HuffmanOnly);

    public static byte[] EncodeGray(ReadOnlySpan<byte> pixels, int width, int height, PngCompression compression)
        => Encode(pixels, width, height, ColorTypeGray, compression);

    /// <summary>pixels interleaved as gray, alpha.</summary>
    public static byte[] EncodeGrayAlpha(ReadOnlySpan<byte> pixels, int width, int height)
        => Encode(pixels, width, height, ColorTypeGrayAlpha, PngCompression.HuffmanOnly);

    /// <summary>pixels interleaved as gray, alpha.</summary>
    public static byte[] EncodeGrayAlpha(ReadOnlySpan<byte> pixels, int width, int height, PngCompression compression)
        => Encode(pixels, width, height, ColorTypeGrayAlpha, compression);

    private static byte[] Encode(ReadOnlySpan<byte> pixels, int width, int height, byte colorType, PngCompression compression)
    {
        if (width <= 0) throw new ArgumentOutOfRangeException(nameof(width), width, "width must be > 0");
        if (height <= 0) throw new ArgumentOutOfRangeException(nameof(height), height, "height must be > 0");
        var channels = colorType == ColorTypeGrayAlpha ? 2 : 1;
        var rowBytes = (long)width * channels;
        var expected = rowBytes * height;
        if (pixels.Length != expected)
            throw new ArgumentException($"pixels holds {pixels.Length} bytes but a {width} x {height} image of {channels} byte(s) a pixel needs {expected}", nameof(pixels));
        var filteredLength = (rowBytes + 1) * height;
        if (filteredLength > Array.MaxLength)
            throw new ArgumentOutOfRangeException(nameof(height), height, "image too large for one in-memory PNG");
        var options = OptionsFor(compression);

        var filtered = ArrayPool<byte>.Shared.Rent((int)filteredLength);
        try
        {
            var stride = (int)rowBytes;
            for (var y = 0; y < height; y++)
            {
                var offset = y * (stride + 1);
                filtered[offset] = 0; // filter type None
                pixels.Slice(y * stride, stride).CopyTo(filtered.AsSpan(offset + 1, stride));
            }

            using var output = new PooledBufferStream(InitialCapacity(filteredLength, compression));
            output.Write(Signature);
            Span<byte> header = stackalloc byte[13];
            BinaryPrimitives.WriteInt32BigEndian(header, width);
            BinaryPrimitives.WriteInt32BigEndian(header[4..], height);
            header[8] = 8; // bit depth
            header[9] = colorType;
            header[10] = 0; // compression method: deflate
            header[11] = 0; // filter method: adaptive (type per row)
            header[12] = 0; // no interlace
            WriteChunk(output, Ihdr, header);

            var idatStart = output.Written.Length;
            output.Reserve(8);
            using (var zlib = new ZLibStream(output, options, leaveOpen: true)) zlib.Write(filtered, 0, (int)filteredLength);
            var dataLength = output.Written.Length - idatStart - 8;
            var idat = output.Written[idatStart..];
            BinaryPrimitives.WriteInt32BigEndian(idat, dataLength);
            Idat.CopyTo(idat[4..]);
            var idatCrc = Crc32.Compute(output.Written.Slice(idatStart + 4, 4 + dataLength));
            BinaryPrimitives.WriteUInt32BigEndian(output.Reserve(4), idatCrc);

            WriteChunk(output, Iend, []);
            return output.Written.ToArray();
        }
        finally
        {
            ArrayPool<byte>.Shared.Return(filtered);
        }
    }

    private static ZLibCompressionOptions OptionsFor(PngCompression compression) => compression switch
    {
        PngCompression.HuffmanOnly => new ZLibCompressionOptions { CompressionLevel = 1, CompressionStrategy = ZLibCompressionStrategy.HuffmanOnly },
        PngCompression.Fastest => new ZLibCompressionOptions { CompressionLevel = 1, CompressionStrategy = ZLibCompressionStrategy.Default },
        PngCompression.Stored => new ZLibCompressionOptions { CompressionLevel = 0 },
        _ => throw new ArgumentOutOfRangeException(nameof(compression), compression, "compression must be HuffmanOnly, Fastest or Stored"),
    };

    // Noisy sky deflates to about 70% with Huffman coding alone; stored adds 5 bytes per 64 KiB block.
    private static int InitialCapacity(long filteredLength, PngCompression compression)
        => (int)Math.Min(Array.MaxLength, (compression == PngCompression.Stored ? filteredLength : filteredLength * 3 / 4) + 1024);

    private static void WriteChunk(PooledBufferStream output, ReadOnlySpan<byte> type, ReadOnlySpan<byte> data)
    {
        BinaryPrimitives.WriteInt32BigEndian(output.Reserve(4), data.Length);
        var start = output.Written.Length;
        output.Write(type);
        output.Write(data);
        var crc = Crc32.Compute(output.Written[start..]);
        BinaryPrimitives.WriteUInt32BigEndian(output.Reserve(4), crc);
    }
}
