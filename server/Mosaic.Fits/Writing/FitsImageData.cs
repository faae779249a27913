using System.Buffers;
using System.Buffers.Binary;
using System.Runtime.InteropServices;

namespace Mosaic.Fits.Writing;

/// <summary>
/// The data of one image HDU being written, taken a strip at a time (rows in FITS order, row 0 = y = 1) so that a
/// large image streams through a small buffer. <see cref="Complete"/> checks the count and pads to the 2880-byte
/// block (FITS 4.0 section 3.3.2).
/// </summary>
public sealed class FitsImageData
{
    private const int ChunkBytes = 1 << 20;

    private readonly FitsWriter _writer;
    private readonly Stream _stream;
    private long _written;
    private bool _completed;

    internal FitsImageData(FitsWriter writer, Stream stream, int bitPix, long expectedBytes)
    {
        _writer = writer;
        _stream = stream;
        BitPix = bitPix;
        ExpectedBytes = expectedBytes;
    }

    public int BitPix { get; }

    /// <summary>Bytes of data the header's BITPIX and NAXISn call for (without padding).</summary>
    public long ExpectedBytes { get; }

    public long WrittenBytes => _written;

    /// <summary>Samples already big-endian in the image's BITPIX.</summary>
    public void WriteBigEndian(ReadOnlySpan<byte> samples)
    {
        Reserve(samples.Length);
        _stream.Write(samples);
    }

    /// <summary>Native floats of a BITPIX -32 image, byte-swapped to big-endian on the way out.</summary>
    public void WriteFloats(ReadOnlySpan<float> values)
    {
        if (BitPix != -32) throw new InvalidOperationException($"WriteFloats is for BITPIX -32 data; this image is BITPIX {BitPix}.");
        Reserve((long)values.Length * sizeof(float));
        var bytes = ArrayPool<byte>.Shared.Rent(Math.Min(ChunkBytes, Math.Max(sizeof(float), values.Length * sizeof(float))));
        try
        {
            var perChunk = bytes.Length / sizeof(float);
            for (var start = 0; start < values.Length; start += perChunk)
            {
                var n = Math.Min(perChunk, values.Length - start);
                var source = MemoryMarshal.Cast<float, uint>(values.Slice(start, n));
                var target = MemoryMarshal.Cast<byte, uint>(bytes.AsSpan(0, n * sizeof(float)));
                BinaryPrimitives.ReverseEndianness(source, target);
                _stream.Write(bytes, 0, n * sizeof(float));
            }
        }
        finally
        {
            ArrayPool<byte>.Shared.Return(bytes);
        }
    }

    /// <summary>Pads the data to a whole block; throws when fewer bytes came than the header declared.</summary>
    public void Complete()
    {
        if (_completed) throw new InvalidOperationException("The image's data were already completed.");
        if (_written != ExpectedBytes)
            throw new InvalidOperationException($"The header declares {ExpectedBytes} bytes of data but {_written} were written.");
        _completed = true;
        _writer.EndData(this, _written);
    }

    private void Reserve(long bytes)
    {
        if (_completed) throw new InvalidOperationException("The image's data were already completed.");
        if (_written + bytes > ExpectedBytes)
            throw new ArgumentException(
                $"{bytes} more bytes would make {_written + bytes}, past the {ExpectedBytes} the header declares.", "samples");
        _written += bytes;
    }
}
