using System.Buffers;
using System.Buffers.Binary;
using System.IO.Compression;

namespace Mosaic.Imaging.Encoding;

/// <summary>
/// Streams one PNG (PNG specification, W3C 2003 / ISO 15948): signature, IHDR, PLTE and tRNS for indexed images,
/// one IDAT, IEND; bit depth 8, filter type 0 on every row, no interlace. Rows are filled in place in a batch
/// buffer and deflated a batch at a time, so an image is never held twice uncompressed.
/// </summary>
public sealed class PngWriter : IDisposable
{
    /// <summary>Rows per deflate call: a 256 x 256 tile goes in one call even as RGBA (262,400 filtered bytes), a large region in 320 KiB steps.</summary>
    private const int BatchBytes = 320 << 10;

    private static ReadOnlySpan<byte> Signature => [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A];

    private readonly int _height;
    private readonly int _stride;
    private readonly PooledBufferStream _output;
    private readonly ZLibStream? _zlib;
    private readonly HuffmanDeflater? _huffman;
    private readonly int _idatStart;
    private byte[]? _batch;
    private int _batchUsed;
    private int _rows;
    private bool _finished;

    /// <param name="palette">PLTE bytes (r, g, b per entry, 1 to 256 entries): required for Indexed, refused otherwise.</param>
    /// <param name="transparency">tRNS alpha per palette entry (Indexed only; may be shorter than the palette).</param>
    public PngWriter(int width, int height, PngColorType colorType, PngCompression compression = PngCompression.HuffmanOnly,
        ReadOnlySpan<byte> palette = default, ReadOnlySpan<byte> transparency = default)
    {
        if (width <= 0) throw new ArgumentOutOfRangeException(nameof(width), width, "width must be > 0");
        if (height <= 0) throw new ArgumentOutOfRangeException(nameof(height), height, "height must be > 0");
        var channels = colorType switch
        {
            PngColorType.Gray or PngColorType.Indexed => 1,
            PngColorType.GrayAlpha => 2,
            PngColorType.Rgb => 3,
            PngColorType.Rgba => 4,
            _ => throw new ArgumentOutOfRangeException(nameof(colorType), colorType, "colorType must be Gray, Rgb, Indexed, GrayAlpha or Rgba"),
        };
        if (colorType == PngColorType.Indexed)
        {
            if (palette.Length == 0 || palette.Length % 3 != 0 || palette.Length > 3 * 256)
                throw new ArgumentException($"an indexed PNG needs 1 to 256 palette entries of 3 bytes, not {palette.Length} bytes", nameof(palette));
            if (transparency.Length > palette.Length / 3)
                throw new ArgumentException("tRNS cannot have more entries than the palette", nameof(transparency));
        }
        else if (!palette.IsEmpty || !transparency.IsEmpty)
            throw new ArgumentException("palette and transparency apply only to indexed PNGs", nameof(palette));
        var rowBytes = (long)width * channels;
        if ((rowBytes + 1) * height > Array.MaxLength || rowBytes + 1 > BatchBytes * 64L)
            throw new ArgumentOutOfRangeException(nameof(height), height, "image too large for one in-memory PNG");
        var options = compression == PngCompression.HuffmanOnly ? null : OptionsFor(compression);
        _height = height;
        _stride = (int)rowBytes + 1;
        RowBytes = (int)rowBytes;

        var filteredLength = (long)_stride * height;
        _output = new PooledBufferStream(InitialCapacity(filteredLength, compression) + palette.Length + transparency.Length);
        _output.Write(Signature);
        Span<byte> header = stackalloc byte[13];
        BinaryPrimitives.WriteInt32BigEndian(header, width);
        BinaryPrimitives.WriteInt32BigEndian(header[4..], height);
        header[8] = 8; // bit depth
        header[9] = (byte)colorType;
        header[10] = 0; // compression method: deflate
        header[11] = 0; // filter method: adaptive (type per row)
        header[12] = 0; // no interlace
        WriteChunk(_output, "IHDR"u8, header);
        if (colorType == PngColorType.Indexed)
        {
            WriteChunk(_output, "PLTE"u8, palette);
            if (!transparency.IsEmpty) WriteChunk(_output, "tRNS"u8, transparency);
        }
        _idatStart = _output.Written.Length;
        _output.Reserve(8);
        if (options is null) _huffman = new HuffmanDeflater(_output);
        else _zlib = new ZLibStream(_output, options, leaveOpen: true);
        _batch = ArrayPool<byte>.Shared.Rent((int)Math.Min(filteredLength, Math.Max(_stride, BatchBytes / _stride * _stride)));
    }

    /// <summary>Bytes in one row of pixels (without the filter byte).</summary>
    public int RowBytes { get; }

    /// <summary>The next row (top to bottom) to fill with pixel bytes; valid until the next call.</summary>
    public Span<byte> NextRow()
    {
        ObjectDisposedException.ThrowIf(_batch is null, this);
        if (_rows == _height) throw new InvalidOperationException($"all {_height} rows are already written");
        if (_batchUsed + _stride > _batch.Length) Flush(final: false);
        var row = _batch.AsSpan(_batchUsed, _stride);
        row[0] = 0; // filter type None
        _batchUsed += _stride;
        _rows++;
        return row[1..];
    }

    /// <summary>Ends the image once every row is written and returns the PNG file bytes.</summary>
    public byte[] Finish()
    {
        ObjectDisposedException.ThrowIf(_batch is null, this);
        if (_finished) throw new InvalidOperationException("the PNG is already finished");
        if (_rows != _height) throw new InvalidOperationException($"{_rows} of {_height} rows written");
        Flush(final: true);
        _zlib?.Dispose();
        var dataLength = _output.Written.Length - _idatStart - 8;
        var idat = _output.Written[_idatStart..];
        BinaryPrimitives.WriteInt32BigEndian(idat, dataLength);
        "IDAT"u8.CopyTo(idat[4..]);
        var idatCrc = System.IO.Hashing.Crc32.HashToUInt32(_output.Written.Slice(_idatStart + 4, 4 + dataLength));
        BinaryPrimitives.WriteUInt32BigEndian(_output.Reserve(4), idatCrc);
        WriteChunk(_output, "IEND"u8, []);
        _finished = true;
        // Every byte is copied over, so the result (on the large-object heap for colour tiles) need not be zeroed first.
        var png = GC.AllocateUninitializedArray<byte>(_output.Written.Length);
        _output.Written.CopyTo(png);
        return png;
    }

    public void Dispose()
    {
        if (_batch is null) return;
        ArrayPool<byte>.Shared.Return(_batch);
        _batch = null;
        _zlib?.Dispose();
        _output.Dispose();
    }

    private void Flush(bool final)
    {
        if (_huffman is not null) _huffman.WriteBlock(_batch.AsSpan(0, _batchUsed), final);
        else if (_batchUsed > 0) _zlib!.Write(_batch!, 0, _batchUsed);
        _batchUsed = 0;
    }

    private static ZLibCompressionOptions OptionsFor(PngCompression compression) => compression switch
    {
        PngCompression.ZlibHuffmanOnly => new ZLibCompressionOptions { CompressionLevel = 1, CompressionStrategy = ZLibCompressionStrategy.HuffmanOnly },
        PngCompression.Fastest => new ZLibCompressionOptions { CompressionLevel = 1, CompressionStrategy = ZLibCompressionStrategy.Default },
        PngCompression.Stored => new ZLibCompressionOptions { CompressionLevel = 0 },
        _ => throw new ArgumentOutOfRangeException(nameof(compression), compression, "compression must be HuffmanOnly, ZlibHuffmanOnly, Fastest or Stored"),
    };

    // Our deflater asks for its worst case (14 bits a byte) for each batch, so start with that for the first one;
    // zlib's Huffman coding gets noisy sky to about 70%; stored adds 5 bytes per 64 KiB block.
    private static int InitialCapacity(long filteredLength, PngCompression compression) => (int)Math.Min(Array.MaxLength / 2, compression switch
    {
        PngCompression.HuffmanOnly => Math.Min(filteredLength, BatchBytes) * 14 / 8 + 2048,
        PngCompression.Stored => filteredLength + filteredLength / 8192 + 1024,
        _ => filteredLength * 3 / 4 + 1024,
    });

    private static void WriteChunk(PooledBufferStream output, ReadOnlySpan<byte> type, ReadOnlySpan<byte> data)
    {
        BinaryPrimitives.WriteInt32BigEndian(output.Reserve(4), data.Length);
        var start = output.Written.Length;
        output.Write(type);
        output.Write(data);
        var crc = System.IO.Hashing.Crc32.HashToUInt32(output.Written[start..]);
        BinaryPrimitives.WriteUInt32BigEndian(output.Reserve(4), crc);
    }
}
