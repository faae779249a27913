using System.Buffers;

namespace Mosaic.Imaging.Encoding;

/// <summary>A write-only, growable stream over pooled arrays: the deflater's sink, so encoding a tile keeps no garbage but the result.</summary>
internal sealed class PooledBufferStream : Stream
{
    private byte[] _buffer;
    private int _length;

    public PooledBufferStream(int initialCapacity) => _buffer = ArrayPool<byte>.Shared.Rent(Math.Max(initialCapacity, 256));

    public Span<byte> Written => _buffer.AsSpan(0, _length);

    public override bool CanRead => false;
    public override bool CanSeek => false;
    public override bool CanWrite => true;
    public override long Length => _length;

    public override long Position
    {
        get => _length;
        set => throw new NotSupportedException("PooledBufferStream only appends");
    }

    /// <summary>Reserves count bytes at the end for the caller to fill later (chunk lengths, CRCs).</summary>
    public Span<byte> Reserve(int count)
    {
        Ensure(count);
        var span = _buffer.AsSpan(_length, count);
        _length += count;
        return span;
    }

    /// <summary>At least sizeHint writable bytes at the end, not yet counted as written (see <see cref="Advance"/>).</summary>
    public Span<byte> GetSpan(int sizeHint)
    {
        Ensure(sizeHint);
        return _buffer.AsSpan(_length);
    }

    /// <summary>Counts count bytes written into the span from <see cref="GetSpan"/>.</summary>
    public void Advance(int count)
    {
        if (count < 0 || (long)_length + count > _buffer.Length) throw new ArgumentOutOfRangeException(nameof(count), count, "advance past the buffer");
        _length += count;
    }

    public override void Write(ReadOnlySpan<byte> buffer)
    {
        Ensure(buffer.Length);
        buffer.CopyTo(_buffer.AsSpan(_length));
        _length += buffer.Length;
    }

    public override void Write(byte[] buffer, int offset, int count) => Write(buffer.AsSpan(offset, count));

    public override void WriteByte(byte value)
    {
        Ensure(1);
        _buffer[_length++] = value;
    }

    public override void Flush() { }

    public override int Read(byte[] buffer, int offset, int count) => throw new NotSupportedException("PooledBufferStream is write-only");

    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException("PooledBufferStream only appends");

    public override void SetLength(long value) => throw new NotSupportedException("PooledBufferStream only appends");

    protected override void Dispose(bool disposing)
    {
        if (_buffer.Length > 0) ArrayPool<byte>.Shared.Return(_buffer);
        _buffer = [];
        _length = 0;
        base.Dispose(disposing);
    }

    private void Ensure(int extra)
    {
        var needed = (long)_length + extra;
        if (needed <= _buffer.Length) return;
        if (needed > Array.MaxLength) throw new InvalidOperationException("PNG data would exceed the largest array");
        var grown = ArrayPool<byte>.Shared.Rent((int)Math.Min(Array.MaxLength, Math.Max(needed, 2L * _buffer.Length)));
        _buffer.AsSpan(0, _length).CopyTo(grown);
        ArrayPool<byte>.Shared.Return(_buffer);
        _buffer = grown;
    }
}
