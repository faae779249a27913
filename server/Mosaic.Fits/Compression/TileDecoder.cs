using System.Buffers;
using System.Buffers.Binary;
using Microsoft.Win32.SafeHandles;
using Mosaic.Fits.Pixels;

namespace Mosaic.Fits.Compression;

/// <summary>Turns one table row into the tile's samples: read the heap bytes, undo the codec, undo the quantisation (FITS 4.0 sections 10.2 and 10.4).</summary>
internal sealed class TileDecoder(SafeFileHandle handle, CompressedImageLayout layout, TileEntry[] entries, double bScale, double bZero)
{
    /// <summary>The quantised integer marking an exact zero under SUBTRACTIVE_DITHER_2 (section 10.2.1).</summary>
    private const int ZeroValue = -2147483646;

    private int SampleBytes => Math.Abs(layout.ZBitPix) / 8;

    public DecodedTile Decode(int tileX, int tileY)
    {
        var entry = entries[tileY * layout.TilesX + tileX];
        var width = (int)Math.Min(layout.Tile[0], layout.Axes[0] - (long)tileX * layout.Tile[0]);
        var height = (int)Math.Min(layout.Tile[1], layout.Axes[1] - (long)tileY * layout.Tile[1]);
        var planePixels = width * height;
        var tilePixels = checked((int)(planePixels * layout.PlanesPerTile));
        RefuseShortStream(entry, tilePixels);
        var output = new byte[planePixels * SampleBytes];

        if (!entry.Compressed.IsEmpty) DecodeCompressed(entry, width, height, tilePixels, planePixels, output);
        else if (!entry.Gzip.IsEmpty)
        {
            // A tile that could not be quantised keeps its floating-point values, gzip-compressed (section 10.4.2).
            var raw = ArrayPool<byte>.Shared.Rent(tilePixels * SampleBytes);
            try
            {
                Inflate(entry.Gzip, raw.AsSpan(0, tilePixels * SampleBytes), SampleBytes, shuffled: false);
                raw.AsSpan(0, output.Length).CopyTo(output);
            }
            finally { ArrayPool<byte>.Shared.Return(raw); }
        }
        else if (!entry.Uncompressed.IsEmpty)
        {
            var column = layout.UncompressedData!;
            if (column.ElementBytes != SampleBytes || (layout.ZBitPix < 0) != (column.Type is 'E' or 'D'))
                throw new TileDataException($"the UNCOMPRESSED_DATA column's type '{column.Type}' does not match ZBITPIX = {layout.ZBitPix}");
            if (entry.Uncompressed.Length != (long)tilePixels * SampleBytes)
                throw new TileDataException($"UNCOMPRESSED_DATA holds {entry.Uncompressed.Length} bytes, but the tile is {tilePixels * (long)SampleBytes}");
            Read(entry.Uncompressed, output);
        }
        else throw new TileDataException("the tile's row holds no data in any column");

        long? blank = layout.ZBitPix > 0 ? entry.NullValue : null;
        return new DecodedTile(output, width, height, new SampleScaling(layout.ZBitPix, bScale, bZero, blank));
    }

    /// <summary>
    /// A decompression bomb (a few bytes claiming a tile of millions of pixels) is refused from the stream's length
    /// alone, before the tile's buffers are allocated. PLIO_1 and HCOMPRESS_1 can code an empty tile in a few bytes, so
    /// for them only the tile-size cap of <see cref="CompressedImageLayout.MaxTilePixels"/> bounds the work.
    /// </summary>
    private void RefuseShortStream(in TileEntry entry, int tilePixels)
    {
        long minimum = 0, length = 0;
        var lossless = !layout.IsQuantized;
        if (!entry.Compressed.IsEmpty)
        {
            length = entry.Compressed.Length;
            minimum = layout.Codec switch
            {
                TileCodec.Rice => RiceDecoder.MinimumStreamBytes(tilePixels, layout.BlockSize, layout.BytePix),
                TileCodec.Gzip1 or TileCodec.Gzip2 => GzipInflater.MinimumStreamBytes((long)tilePixels * (lossless ? SampleBytes : 4)),
                _ => 0,
            };
        }
        else if (!entry.Gzip.IsEmpty)
        {
            length = entry.Gzip.Length;
            minimum = GzipInflater.MinimumStreamBytes((long)tilePixels * SampleBytes);
        }
        if (length < minimum)
            throw new TileDataException(
                $"{length} compressed bytes cannot code a tile of {tilePixels} pixels ({layout.CodecName} needs at least {minimum}); a decompression bomb or a cut stream");
    }

    private void DecodeCompressed(in TileEntry entry, int width, int height, int tilePixels, int planePixels, byte[] output)
    {
        // Integers out of the codec: the image's own samples, or quantised values (4 bytes) of a floating-point image.
        var lossless = !layout.IsQuantized;
        var intBytes = lossless ? SampleBytes : 4;
        switch (layout.Codec)
        {
            case TileCodec.Rice:
            {
                var values = ArrayPool<int>.Shared.Rent(tilePixels);
                try
                {
                    var input = ReadPooled(entry.Compressed, tilePixels * (long)layout.BytePix, out var length);
                    try { RiceDecoder.Decode(input.AsSpan(0, length), layout.BlockSize, layout.BytePix, values.AsSpan(0, tilePixels)); }
                    finally { ArrayPool<byte>.Shared.Return(input); }
                    var plane = values.AsSpan(0, planePixels);
                    if (lossless) StoreIntegers(plane, output);
                    else Dequantize(plane, entry, output);
                }
                finally { ArrayPool<int>.Shared.Return(values); }
                break;
            }
            case TileCodec.Gzip1 or TileCodec.Gzip2 or TileCodec.NoCompress:
            {
                var size = tilePixels * intBytes;
                var raw = ArrayPool<byte>.Shared.Rent(size);
                try
                {
                    var bytes = raw.AsSpan(0, size);
                    if (layout.Codec == TileCodec.NoCompress)
                    {
                        if (entry.Compressed.Length != size)
                            throw new TileDataException($"the NOCOMPRESS tile holds {entry.Compressed.Length} bytes, but the tile is {size}");
                        Read(entry.Compressed, bytes);
                    }
                    else Inflate(entry.Compressed, bytes, intBytes, shuffled: layout.Codec == TileCodec.Gzip2);

                    if (lossless) bytes[..output.Length].CopyTo(output);
                    else
                    {
                        var values = ArrayPool<int>.Shared.Rent(planePixels);
                        try
                        {
                            var plane = values.AsSpan(0, planePixels);
                            for (var i = 0; i < plane.Length; i++) plane[i] = BinaryPrimitives.ReadInt32BigEndian(bytes[(i * 4)..]);
                            Dequantize(plane, entry, output);
                        }
                        finally { ArrayPool<int>.Shared.Return(values); }
                    }
                }
                finally { ArrayPool<byte>.Shared.Return(raw); }
                break;
            }
            case TileCodec.Plio:
            {
                // The line list is a 1PI column: 16-bit big-endian words.
                var values = ArrayPool<int>.Shared.Rent(tilePixels);
                var words = ArrayPool<short>.Shared.Rent((int)(entry.Compressed.Length / 2));
                try
                {
                    var input = ReadPooled(entry.Compressed, tilePixels * 8L, out var length);
                    try
                    {
                        var list = words.AsSpan(0, length / 2);
                        for (var i = 0; i < list.Length; i++) list[i] = BinaryPrimitives.ReadInt16BigEndian(input.AsSpan(2 * i));
                        PlioDecoder.Decode(list, values.AsSpan(0, tilePixels));
                    }
                    finally { ArrayPool<byte>.Shared.Return(input); }
                    var plane = values.AsSpan(0, planePixels);
                    if (lossless) StoreIntegers(plane, output);
                    else Dequantize(plane, entry, output);
                }
                finally
                {
                    ArrayPool<int>.Shared.Return(values);
                    ArrayPool<short>.Shared.Return(words);
                }
                break;
            }
            case TileCodec.HCompress:
            {
                if (layout.PlanesPerTile != 1) throw new TileDataException("HCOMPRESS_1 tiles are 2-D, but ZTILE3 and up make this tile deeper");
                var values = ArrayPool<long>.Shared.Rent(tilePixels);
                try
                {
                    var input = ReadPooled(entry.Compressed, tilePixels * 8L, out var length);
                    try { HCompressDecoder.Decode(input.AsSpan(0, length), height, width, values.AsSpan(0, tilePixels)); }
                    finally { ArrayPool<byte>.Shared.Return(input); }
                    var ints = ArrayPool<int>.Shared.Rent(planePixels);
                    try
                    {
                        var plane = ints.AsSpan(0, planePixels);
                        for (var i = 0; i < plane.Length; i++) plane[i] = (int)Math.Clamp(values[i], int.MinValue, int.MaxValue);
                        if (lossless && layout.ZBitPix == 64) StoreLongs(values.AsSpan(0, planePixels), output);
                        else if (lossless) StoreIntegers(plane, output);
                        else Dequantize(plane, entry, output);
                    }
                    finally { ArrayPool<int>.Shared.Return(ints); }
                }
                finally { ArrayPool<long>.Shared.Return(values); }
                break;
            }
            default:
                throw new NotSupportedException($"tile compression {layout.CodecName} is not supported by this reader");
        }
    }

    private static void StoreLongs(ReadOnlySpan<long> values, Span<byte> output)
    {
        for (var i = 0; i < values.Length; i++) BinaryPrimitives.WriteInt64BigEndian(output[(8 * i)..], values[i]);
    }

    /// <summary>
    /// Codec integers to big-endian samples of ZBITPIX (8-bit images are unsigned, section 5.2.1). Values outside the
    /// type (lossy HCOMPRESS_1 can overshoot) are clipped to its range, as the reference library's conversion does.
    /// </summary>
    private void StoreIntegers(ReadOnlySpan<int> values, Span<byte> output)
    {
        switch (layout.ZBitPix)
        {
            case 8:
                for (var i = 0; i < values.Length; i++) output[i] = (byte)Math.Clamp(values[i], byte.MinValue, byte.MaxValue);
                break;
            case 16:
                for (var i = 0; i < values.Length; i++) BinaryPrimitives.WriteInt16BigEndian(output[(2 * i)..], (short)Math.Clamp(values[i], short.MinValue, short.MaxValue));
                break;
            case 32:
                for (var i = 0; i < values.Length; i++) BinaryPrimitives.WriteInt32BigEndian(output[(4 * i)..], values[i]);
                break;
            default:
                for (var i = 0; i < values.Length; i++) BinaryPrimitives.WriteInt64BigEndian(output[(8 * i)..], values[i]);
                break;
        }
    }

    /// <summary>
    /// Section 10.2: value = (I - R + 0.5) * ZSCALE + ZZERO with subtractive dithering, I * ZSCALE + ZZERO without;
    /// I = ZBLANK is undefined (NaN), and under SUBTRACTIVE_DITHER_2 the reserved ZeroValue is exactly 0. The random
    /// sequence starts at (row - 1 + ZDITHER0 - 1) mod 10000 (1-based row) and advances one place per pixel.
    /// </summary>
    private void Dequantize(ReadOnlySpan<int> values, in TileEntry entry, Span<byte> output)
    {
        var random = DitherSequence.Values;
        var dither = layout.Quantize is QuantizeMethod.SubtractiveDither1 or QuantizeMethod.SubtractiveDither2;
        var keepZero = layout.Quantize == QuantizeMethod.SubtractiveDither2;
        var hasNull = entry.NullValue is long n && n >= int.MinValue && n <= int.MaxValue;
        var nullValue = hasNull ? (int)entry.NullValue!.Value : 0;
        var scale = entry.Scale;
        var zero = entry.Zero;
        var single = layout.ZBitPix == -32;

        var seed = (int)((entry.Row + layout.DitherSeed - 1) % DitherSequence.Length);
        var next = (int)(random[seed] * 500);
        for (var i = 0; i < values.Length; i++)
        {
            var q = values[i];
            double value;
            if (hasNull && q == nullValue) value = double.NaN;
            else if (keepZero && q == ZeroValue) value = 0.0;
            else if (dither) value = (q - (double)random[next] + 0.5) * scale + zero;
            else value = q * scale + zero;

            if (single) BinaryPrimitives.WriteSingleBigEndian(output[(4 * i)..], (float)value);
            else BinaryPrimitives.WriteDoubleBigEndian(output[(8 * i)..], value);

            if (dither && ++next == DitherSequence.Length)
            {
                if (++seed == DitherSequence.Length) seed = 0;
                next = (int)(random[seed] * 500);
            }
        }
    }

    private void Inflate(HeapSpan span, Span<byte> output, int valueBytes, bool shuffled)
    {
        var input = ReadPooled(span, output.Length, out var length);
        try
        {
            if (!shuffled || valueBytes == 1)
            {
                GzipInflater.Inflate(input, length, output);
                return;
            }
            var staging = ArrayPool<byte>.Shared.Rent(output.Length);
            try
            {
                GzipInflater.Inflate(input, length, staging.AsSpan(0, output.Length));
                GzipInflater.Unshuffle(staging.AsSpan(0, output.Length), output, valueBytes);
            }
            finally { ArrayPool<byte>.Shared.Return(staging); }
        }
        finally { ArrayPool<byte>.Shared.Return(input); }
    }

    /// <summary>The compressed bytes, refused when far larger than the tile they decode to (no codec here expands data that much).</summary>
    private byte[] ReadPooled(HeapSpan span, long decodedBytes, out int length)
    {
        if (span.Length > 2 * decodedBytes + 65536)
            throw new TileDataException($"{span.Length} compressed bytes for a tile of {decodedBytes} bytes is more than any codec here produces");
        length = (int)span.Length;
        var buffer = ArrayPool<byte>.Shared.Rent(length);
        try { Read(span, buffer.AsSpan(0, length)); }
        catch { ArrayPool<byte>.Shared.Return(buffer); throw; }
        return buffer;
    }

    private void Read(HeapSpan span, Span<byte> destination)
    {
        ObjectDisposedException.ThrowIf(handle.IsClosed, this);
        var done = 0;
        while (done < destination.Length)
        {
            var n = RandomAccess.Read(handle, destination[done..], span.Offset + done);
            if (n == 0) throw new TileDataException($"truncated data: the file ends before byte {span.Offset + destination.Length}");
            done += n;
        }
    }
}
