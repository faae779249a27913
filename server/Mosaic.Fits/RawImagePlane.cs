using System.Buffers;
using System.Buffers.Binary;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using Microsoft.Win32.SafeHandles;
using Mosaic.Fits.Pixels;
using Mosaic.Fits.Reading;

namespace Mosaic.Fits;

/// <summary>
/// The plane of an uncompressed primary array or IMAGE extension, read with positional reads (never memory-mapped, so
/// a file truncated under us is an exception, not a SIGBUS). Thread-safe.
/// </summary>
public sealed class RawImagePlane : ImagePlane
{
    /// <summary>Bytes per positional read on the streaming path: large enough for GB/s, small enough to stay in cache.</summary>
    private const int ChunkBytes = 1 << 20;

    private readonly SampleScaling _scaling;

    internal RawImagePlane(SafeFileHandle handle, string filePath, int hduIndex, int bitPix, int width, int height,
        double bScale, double bZero, long? blank, long dataOffset)
        : base(filePath, hduIndex, bitPix, width, height)
    {
        Handle = handle; BScale = bScale; BZero = bZero; Blank = blank; DataOffset = dataOffset;
        _scaling = new SampleScaling(bitPix, bScale, bZero, blank);
    }

    internal SafeFileHandle Handle { get; }
    public double BScale { get; }
    public double BZero { get; }
    public long? Blank { get; }
    /// <summary>Byte offset of this plane's first pixel in the file.</summary>
    public long DataOffset { get; }
    public int BytesPerPixel => Math.Abs(BitPix) / 8;

    protected override void ReadRowCore(int y, int x, Span<float> destination) => ReadSamples((long)y * Width + x, destination);

    protected override void ReadRowsCore(int y, int rowCount, Span<float> destination) => ReadSamples((long)y * Width, destination);

    /// <summary>
    /// One read per row straight from the file descriptor, the handle held open once for the block; stored floats
    /// land in the destination and are swapped in place, other samples go through one scratch row.
    /// </summary>
    // Fully optimised from the first call: a fresh server reads its first tiles before tiering would get here.
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    protected override void ReadBlockCore(int x, int y, int width, int rowCount, int rowStep, Span<float> destination)
    {
        var rowBytes = (long)width * BytesPerPixel;
        if (!DirectPRead.IsAvailable || rowBytes > ChunkBytes)
        {
            base.ReadBlockCore(x, y, width, rowCount, rowStep, destination);
            return;
        }
        var storedFloats = BitPix == -32 && _scaling.Mode == ScalingMode.Identity;
        var scratch = storedFloats ? null : ArrayPool<byte>.Shared.Rent((int)rowBytes);
        var added = false;
        try
        {
            Handle.DangerousAddRef(ref added);
            var fd = (int)Handle.DangerousGetHandle();
            // File rows in ascending order whichever way the destination runs: descending reads measured slower.
            for (var k = 0; k < rowCount; k++)
            {
                var j = rowStep > 0 ? k : rowCount - 1 - k;
                var row = destination.Slice(j * width, width);
                var offset = DataOffset + ((long)(y + j * rowStep) * Width + x) * BytesPerPixel;
                if (storedFloats)
                {
                    ReadDirect(fd, MemoryMarshal.AsBytes(row), offset);
                    var words = MemoryMarshal.Cast<float, uint>(row);
                    BinaryPrimitives.ReverseEndianness(words, words);
                }
                else
                {
                    var raw = scratch.AsSpan(0, (int)rowBytes);
                    ReadDirect(fd, raw, offset);
                    SampleDecoder.Decode(BitPix, raw, row, _scaling);
                }
            }
        }
        finally
        {
            if (added) Handle.DangerousRelease();
            if (scratch is not null) ArrayPool<byte>.Shared.Return(scratch);
        }
    }

    /// <summary>The end of the file or an error hands the rest to <see cref="ReadExactly"/>, which reports it.</summary>
    private void ReadDirect(int fd, Span<byte> buffer, long offset)
    {
        var done = 0;
        while (done < buffer.Length)
        {
            var n = DirectPRead.Read(fd, buffer[done..], offset + done);
            if (n <= 0)
            {
                ReadExactly(buffer[done..], offset + done);
                return;
            }
            done += n;
        }
    }

    protected override double ReadValueCore(int x, int y)
    {
        Span<byte> raw = stackalloc byte[8];
        raw = raw[..BytesPerPixel];
        ReadExactly(raw, DataOffset + ((long)y * Width + x) * BytesPerPixel);
        return SampleDecoder.DecodeOne(BitPix, raw, _scaling);
    }

    private void ReadSamples(long firstSample, Span<float> destination)
    {
        if (destination.IsEmpty) return;
        var offset = DataOffset + firstSample * BytesPerPixel;

        if (BitPix == -32 && _scaling.Mode == ScalingMode.Identity)
        {
            // Stored floats need only a byte swap: read straight into the destination, in spans a byte count can index.
            const int DirectFloats = 1 << 24;
            for (var done = 0; done < destination.Length; done += DirectFloats)
            {
                var part = destination.Slice(done, Math.Min(DirectFloats, destination.Length - done));
                ReadExactly(MemoryMarshal.AsBytes(part), offset + (long)done * sizeof(float));
                var words = MemoryMarshal.Cast<float, uint>(part);
                BinaryPrimitives.ReverseEndianness(words, words);
            }
            return;
        }

        var perChunk = ChunkBytes / BytesPerPixel;
        var scratch = ArrayPool<byte>.Shared.Rent((int)Math.Min(ChunkBytes, (long)destination.Length * BytesPerPixel));
        try
        {
            for (var done = 0; done < destination.Length; done += perChunk)
            {
                var count = Math.Min(perChunk, destination.Length - done);
                var chunk = scratch.AsSpan(0, count * BytesPerPixel);
                ReadExactly(chunk, offset + (long)done * BytesPerPixel);
                SampleDecoder.Decode(BitPix, chunk, destination.Slice(done, count), _scaling);
            }
        }
        finally
        {
            ArrayPool<byte>.Shared.Return(scratch);
        }
    }

    private void ReadExactly(Span<byte> buffer, long offset)
    {
        ObjectDisposedException.ThrowIf(Handle.IsClosed, this);
        var done = 0;
        while (done < buffer.Length)
        {
            int n;
            try
            {
                n = RandomAccess.Read(Handle, buffer[done..], offset + done);
            }
            catch (IOException e)
            {
                throw new FitsFormatException(FilePath, HduIndex, null, $"cannot read pixel data at byte {offset + done}: {e.Message}", e);
            }
            if (n == 0)
                throw new FitsFormatException(FilePath, HduIndex, null,
                    $"truncated data: the file ends before byte {offset + buffer.Length} (it was cut short or rewritten after opening)");
            done += n;
        }
    }
}
