using System.Buffers.Binary;
using System.Numerics;
using System.Runtime.CompilerServices;

namespace Mosaic.Fits.Compression;

/// <summary>
/// RICE_1 (FITS 4.0 section 10.4.1): the first value stored plainly in BYTEPIX bytes, then blocks of BLOCKSIZE
/// differences, each block led by a code-length field (3, 4 or 5 bits for 1, 2 or 4 bytes per value) saying: all
/// differences zero, differences stored plainly, or differences Rice-coded with that many low bits after a unary
/// high part. Differences are zig-zag mapped (even = non-negative) and wrap in the value's width.
/// </summary>
internal static class RiceDecoder
{
    public static void Decode(ReadOnlySpan<byte> input, int blockSize, int bytePix, Span<int> output)
    {
        var (fsBits, fsMax, bBits) = bytePix switch
        {
            1 => (3, 6, 8),
            2 => (4, 14, 16),
            4 => (5, 25, 32),
            _ => throw new TileDataException($"RICE_1 with BYTEPIX = {bytePix} is not defined (section 10.4.1 allows 1, 2 and 4)"),
        };
        if (input.Length < bytePix) throw new TileDataException("the RICE_1 stream is shorter than its first value");
        var mask = bBits == 32 ? uint.MaxValue : (1u << bBits) - 1;
        var last = bytePix switch
        {
            1 => input[0],
            2 => BinaryPrimitives.ReadUInt16BigEndian(input),
            _ => BinaryPrimitives.ReadUInt32BigEndian(input),
        };

        var bits = new BitReader(input[bytePix..]);
        var n = output.Length;
        for (var i = 0; i < n;)
        {
            var fs = (int)bits.Read(fsBits) - 1;
            var end = Math.Min(n, i + blockSize);
            if (fs < 0)
            {
                // Low entropy: every difference in the block is zero.
                output[i..end].Fill(Widen(last, bytePix));
                i = end;
            }
            else if (fs == fsMax)
            {
                for (; i < end; i++)
                {
                    last = (last + Unmap(bits.Read(bBits))) & mask;
                    output[i] = Widen(last, bytePix);
                }
            }
            else
            {
                for (; i < end; i++)
                {
                    var high = bits.CountZerosThroughOne();
                    var diff = (high << fs) | (fs == 0 ? 0u : bits.Read(fs));
                    last = (last + Unmap(diff)) & mask;
                    output[i] = Widen(last, bytePix);
                }
            }
        }
        // The encoder flushes its last partial byte and stops: whole bytes left over mean the stream codes another tile.
        if (bits.UnreadBytes > 0)
            throw new TileDataException($"the RICE_1 stream has {bits.UnreadBytes} bytes after the tile's last value");
    }

    /// <summary>
    /// The shortest stream that can code <paramref name="pixels"/> values: the first value, then one code-length field
    /// per block (section 10.4.1). Checked before any tile buffer is allocated, so a few bytes cannot claim a huge tile.
    /// </summary>
    public static long MinimumStreamBytes(long pixels, int blockSize, int bytePix)
    {
        var fsBits = bytePix switch { 1 => 3, 2 => 4, _ => 5 };
        var blocks = (pixels + blockSize - 1) / blockSize;
        return bytePix + (blocks * fsBits + 7) / 8;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static uint Unmap(uint d) => (d & 1) == 0 ? d >> 1 : ~(d >> 1);

    /// <summary>1-byte values are unsigned (BITPIX 8), 2- and 4-byte values two's complement.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static int Widen(uint v, int bytePix) => bytePix switch
    {
        1 => (int)v,
        2 => (short)v,
        _ => (int)v,
    };

    /// <summary>Most-significant-bit-first reader; running past the end is a decode error, never a read of zeros.</summary>
    private ref struct BitReader(ReadOnlySpan<byte> data)
    {
        private readonly ReadOnlySpan<byte> _data = data;
        private int _position;
        private ulong _buffer;
        private int _count;

        /// <summary>Whole bytes not yet consumed, counting those already buffered.</summary>
        public readonly int UnreadBytes => _data.Length - _position + _count / 8;

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        private void Fill()
        {
            while (_count <= 48 && _position < _data.Length)
            {
                _buffer = (_buffer << 8) | _data[_position++];
                _count += 8;
            }
        }

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        public uint Read(int k)
        {
            if (_count < k)
            {
                Fill();
                if (_count < k) throw new TileDataException("the RICE_1 stream ends before the tile is complete");
            }
            _count -= k;
            return (uint)(_buffer >> _count) & (k == 32 ? uint.MaxValue : (1u << k) - 1);
        }

        /// <summary>Zero bits up to and including the next one bit: the unary high part of a Rice code.</summary>
        public uint CountZerosThroughOne()
        {
            uint zeros = 0;
            while (true)
            {
                if (_count == 0)
                {
                    Fill();
                    if (_count == 0) throw new TileDataException("the RICE_1 stream ends before the tile is complete");
                }
                var live = _buffer & ((1UL << _count) - 1);
                if (live == 0)
                {
                    zeros += (uint)_count;
                    _count = 0;
                    continue;
                }
                var top = 63 - BitOperations.LeadingZeroCount(live);
                zeros += (uint)(_count - 1 - top);
                _count = top;
                return zeros;
            }
        }
    }
}
