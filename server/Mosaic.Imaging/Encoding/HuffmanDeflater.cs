using System.Buffers.Binary;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;

namespace Mosaic.Imaging.Encoding;

/// <summary>
/// A zlib stream (RFC 1950) of deflate blocks (RFC 1951) with dynamic Huffman codes for literals only, no string
/// matches: what zlib's Huffman-only strategy writes, without its match-finder set-up and per-call overhead. Each
/// call to <see cref="WriteBlock"/> is one block with its own code, fitted to that block's byte counts (to a sample
/// of them past 32 KiB), with codes of at most 14 bits.
/// </summary>
internal sealed class HuffmanDeflater
{
    private const int Literals = 257; // bytes 0..255 and end-of-block (256)
    private const int EndOfBlock = 256;
    private const int MaxCodeLength = 14; // deflate allows 15; 14 lets four codes join in one 64-bit group (see Encode)
    private const int MaxLengthCodeLength = 7;
    private const uint AdlerModulus = 65521;
    private const int SampleBytes = 16 << 10;
    private const int SampleRun = 64;
    private const int GoldenFraction = 40503; // 2^16 (√5 - 1) / 2: offsets j·φ mod 1 spread evenly for any count
    private const int AdlerChunk = 5552; // largest run whose sums cannot overflow 32 bits before the modulus (RFC 1950)

    // Order in which the code-length code's lengths are sent (RFC 1951, 3.2.7).
    private static ReadOnlySpan<byte> LengthOrder => [16, 17, 18, 0, 8, 7, 9, 6, 10, 5, 11, 4, 12, 3, 13, 2, 14, 1, 15];

    private readonly PooledBufferStream _output;
    private uint _adlerA = 1;
    private uint _adlerB;
    private ulong _bits;
    private int _bitCount;
    private bool _finished;

    public HuffmanDeflater(PooledBufferStream output)
    {
        _output = output;
        // CMF: deflate with a 32 KiB window; FLG: fastest-compression level, check bits making CMF·256 + FLG a multiple of 31.
        _output.WriteByte(0x78);
        _output.WriteByte(0x01);
    }

    public void WriteBlock(ReadOnlySpan<byte> data, bool final)
    {
        if (_finished) throw new InvalidOperationException("the zlib stream is already finished");
        Span<long> frequencies = stackalloc long[Literals];
        Count(data, frequencies);
        frequencies[EndOfBlock] = 1;
        Span<byte> lengths = stackalloc byte[Literals + 1];
        HuffmanCode.Lengths(frequencies, MaxCodeLength, lengths[..Literals]);
        // One distance code of length 1, unused: RFC 1951 3.2.7 allows it, and every inflater accepts it.
        lengths[Literals] = 1;
        Span<uint> codes = stackalloc uint[Literals];
        HuffmanCode.Codes(lengths[..Literals], codes);

        // Worst case: 14 bits a byte, plus the header, plus 8 bytes for the main loop's store past the end.
        var worst = (long)data.Length * MaxCodeLength / 8 + 512;
        var span = _output.GetSpan((int)Math.Min(int.MaxValue, worst));
        if (span.Length < worst) throw new InvalidOperationException("the output buffer is too small for a deflate block");
        var at = 0;
        Put(span, ref at, final ? 1u : 0u, 1);
        Put(span, ref at, 2, 2); // dynamic Huffman codes
        WriteCodeLengths(span, ref at, lengths);
        // Put leaves up to 31 bits pending: down to fewer than 8 for the main loop.
        for (; _bitCount >= 8; _bitCount -= 8, _bits >>= 8) span[at++] = (byte)_bits;

        Span<ulong> wide = stackalloc ulong[Literals];
        for (var k = 0; k < Literals; k++) wide[k] = codes[k];
        var i = Encode(data, wide, lengths, span, ref at);
        for (; i < data.Length; i++) Put(span, ref at, codes[data[i]], lengths[data[i]]);
        Put(span, ref at, codes[EndOfBlock], lengths[EndOfBlock]);
        if (final) at = Drain(span, at);
        _output.Advance(at);
        Adler(data);
        if (final)
        {
            Span<byte> adler = stackalloc byte[4];
            BinaryPrimitives.WriteUInt32BigEndian(adler, (_adlerB << 16) | _adlerA);
            _output.Write(adler);
            _finished = true;
        }
    }

    public bool IsFinished => _finished;

    /// <summary>
    /// The symbols four at a time, from fewer than 8 pending bits; returns how many were coded. Each group's four
    /// codes are joined first (their shifts are the partial sums of their lengths, independent of the stream), so
    /// the chain carried from group to group is one shift, one OR and one add, not four: the coder was bound by
    /// that chain. Lengths of at most 14 bits keep 7 pending plus four codes within 64 bits. Storing all 8 bytes and
    /// advancing by the whole bytes pending has no branch; bytes stored past the advance are overwritten by the
    /// next store, and the span's slack covers the last one.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private int Encode(ReadOnlySpan<byte> data, ReadOnlySpan<ulong> codes, ReadOnlySpan<byte> lengths, Span<byte> span, ref int at)
    {
        ref var p = ref MemoryMarshal.GetReference(data);
        ref var code = ref MemoryMarshal.GetReference(codes);
        ref var length = ref MemoryMarshal.GetReference(lengths);
        ref var start = ref span[at];
        ref var o = ref start;
        var bits = _bits;
        var count = _bitCount;
        // Moving references and unsigned indices: a byte widens to an index for free, and few registers are live.
        // Two groups a step; a group's length total is summed as a tree, off the chain through count.
        ref var end = ref Unsafe.Add(ref p, data.Length & ~7);
        while (Unsafe.IsAddressLessThan(ref p, ref end))
        {
            o = ref Group(ref p, ref code, ref length, ref o, ref bits, ref count);
            o = ref Group(ref Unsafe.Add(ref p, 4), ref code, ref length, ref o, ref bits, ref count);
            p = ref Unsafe.Add(ref p, 8);
        }
        if ((data.Length & 4) != 0) o = ref Group(ref p, ref code, ref length, ref o, ref bits, ref count);
        var i = data.Length & ~3;
        _bits = bits;
        _bitCount = count;
        at += (int)Unsafe.ByteOffset(ref start, ref o);
        return i;
    }

    /// <summary>Four symbols from p onto the stream at o; returns where the stream's next whole byte goes.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static ref byte Group(scoped ref byte p, scoped ref ulong code, scoped ref byte length, ref byte o, scoped ref ulong bits, scoped ref int count)
    {
        nuint s0 = p, s1 = Unsafe.Add(ref p, 1), s2 = Unsafe.Add(ref p, 2), s3 = Unsafe.Add(ref p, 3);
        int l0 = Unsafe.Add(ref length, s0), l1 = Unsafe.Add(ref length, s1), l2 = Unsafe.Add(ref length, s2), l3 = Unsafe.Add(ref length, s3);
        var low = l0 + l1;
        var c01 = Unsafe.Add(ref code, s0) | (Unsafe.Add(ref code, s1) << l0);
        var c23 = Unsafe.Add(ref code, s2) | (Unsafe.Add(ref code, s3) << l2);
        bits |= (c01 | (c23 << low)) << count;
        count += low + (l2 + l3);
        Unsafe.WriteUnaligned(ref o, BitConverter.IsLittleEndian ? bits : BinaryPrimitives.ReverseEndianness(bits));
        var whole = (uint)count & ~7u;
        bits >>= (int)whole;
        count &= 7;
        return ref Unsafe.Add(ref o, whole >> 3);
    }

    /// <summary>
    /// Byte counts for the block's code. Past <see cref="SampleBytes"/> × 2 only that many bytes are counted, as
    /// 64-byte runs spread over the block (one run per stretch, at a golden-ratio offset so runs do not line up
    /// with the rows' columns): a code fitted to a sample of n bytes costs about (symbols - 1) / (2 n ln 2) bits a
    /// byte more than one fitted to the whole (well under 1 % here), and counting was a third of the encoder's time.
    /// A byte value the sample missed may still occur, so every value keeps a count of at least 1.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void Count(ReadOnlySpan<byte> data, Span<long> frequencies)
    {
        // Four tables so runs of one byte value do not stall on the same counter; indices are bytes, so in range.
        Span<uint> counts = stackalloc uint[4 * 256];
        var sampled = data.Length > 2 * SampleBytes;
        if (!sampled) CountRun(data, counts);
        else
        {
            const int runs = SampleBytes / SampleRun;
            var stride = data.Length / runs;
            for (var j = 0; j < runs; j++)
            {
                var offset = (int)(((ulong)(uint)(j * GoldenFraction) & 0xFFFF) * (ulong)(stride - SampleRun) >> 16);
                CountRun(data.Slice(j * stride + offset, SampleRun), counts);
            }
        }
        var floor = sampled ? 1L : 0L;
        for (var b = 0; b < 256; b++) frequencies[b] = Math.Max(floor, (long)counts[b] + counts[256 + b] + counts[512 + b] + counts[768 + b]);
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static void CountRun(ReadOnlySpan<byte> data, Span<uint> counts)
    {
        ref var c = ref MemoryMarshal.GetReference(counts);
        ref var d = ref MemoryMarshal.GetReference(data);
        var i = 0;
        var n = data.Length;
        for (; i <= n - 4; i += 4)
        {
            var word = Unsafe.ReadUnaligned<uint>(ref Unsafe.Add(ref d, i));
            Unsafe.Add(ref c, (int)(word & 0xFF))++;
            Unsafe.Add(ref c, 256 + (int)((word >> 8) & 0xFF))++;
            Unsafe.Add(ref c, 512 + (int)((word >> 16) & 0xFF))++;
            Unsafe.Add(ref c, 768 + (int)(word >> 24))++;
        }
        for (; i < n; i++) Unsafe.Add(ref c, Unsafe.Add(ref d, i))++;
    }

    // HLIT, HDIST, HCLEN, the code-length code, then the 258 lengths coded with it (no run-length codes).
    private void WriteCodeLengths(Span<byte> span, ref int at, ReadOnlySpan<byte> lengths)
    {
        Span<long> frequencies = stackalloc long[19];
        foreach (var l in lengths) frequencies[l]++;
        Span<byte> lengthLengths = stackalloc byte[19];
        HuffmanCode.Lengths(frequencies, MaxLengthCodeLength, lengthLengths);
        Span<uint> lengthCodes = stackalloc uint[19];
        HuffmanCode.Codes(lengthLengths, lengthCodes);
        Put(span, ref at, Literals - 257, 5);
        Put(span, ref at, 0, 5); // one distance code
        Put(span, ref at, 19 - 4, 4);
        foreach (var symbol in LengthOrder) Put(span, ref at, lengthLengths[symbol], 3);
        foreach (var l in lengths) Put(span, ref at, lengthCodes[l], lengthLengths[l]);
    }

    private void Put(Span<byte> span, ref int at, uint code, int length)
    {
        _bits |= (ulong)code << _bitCount;
        _bitCount += length;
        if (_bitCount >= 32)
        {
            BinaryPrimitives.WriteUInt32LittleEndian(span[at..], (uint)_bits);
            at += 4;
            _bits >>= 32;
            _bitCount -= 32;
        }
    }

    // The final block ends the stream on a byte boundary.
    private int Drain(Span<byte> span, int at)
    {
        while (_bitCount > 0)
        {
            span[at++] = (byte)_bits;
            _bits >>= 8;
            _bitCount -= 8;
        }
        _bits = 0;
        _bitCount = 0;
        return at;
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void Adler(ReadOnlySpan<byte> data)
    {
        uint a = _adlerA, b = _adlerB;
        while (!data.IsEmpty)
        {
            var chunk = data[..Math.Min(AdlerChunk, data.Length)];
            var k = 0;
            if (Avx2.IsSupported) k = AdlerVector(chunk, ref a, ref b);
            // Four bytes a step: b gains 4a + 4x0 + 3x1 + 2x2 + x3, shortening the chain through a.
            for (; k <= chunk.Length - 4; k += 4)
            {
                uint x0 = chunk[k], x1 = chunk[k + 1], x2 = chunk[k + 2], x3 = chunk[k + 3];
                b += 4 * a + 4 * x0 + 3 * x1 + 2 * x2 + x3;
                a += x0 + x1 + x2 + x3;
            }
            for (; k < chunk.Length; k++)
            {
                a += chunk[k];
                b += a;
            }
            a %= AdlerModulus;
            b %= AdlerModulus;
            data = data[chunk.Length..];
        }
        (_adlerA, _adlerB) = (a, b);
    }

    // 32 bytes a step: a gains their sum; b gains 32 a (for a before the step) plus the sum of (32 - j) x_j.
    // Sums stay below 2^32 within one chunk of at most AdlerChunk bytes, as in the scalar loop.
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static int AdlerVector(ReadOnlySpan<byte> chunk, ref uint a, ref uint b)
    {
        ref var p = ref MemoryMarshal.GetReference(chunk);
        var weights = Vector256.Create((sbyte)32, 31, 30, 29, 28, 27, 26, 25, 24, 23, 22, 21, 20, 19, 18, 17, 16, 15, 14, 13, 12, 11, 10, 9, 8, 7, 6, 5, 4, 3, 2, 1);
        var ones = Vector256.Create((short)1);
        var sumA = Vector256<uint>.Zero;
        var sumB = Vector256<uint>.Zero;
        var priorA = Vector256<uint>.Zero;
        var steps = chunk.Length / 32;
        for (var s = 0; s < steps; s++)
        {
            var x = Vector256.LoadUnsafe(ref p, (nuint)(32 * s));
            priorA += sumA;
            sumA += Avx2.SumAbsoluteDifferences(x, Vector256<byte>.Zero).AsUInt32();
            sumB += Avx2.MultiplyAddAdjacent(Avx2.MultiplyAddAdjacent(x, weights), ones).AsUInt32();
        }
        var byteSum = Vector256.Sum(sumA);
        b += (uint)(32 * steps) * a + 32 * Vector256.Sum(priorA) + Vector256.Sum(sumB);
        a += byteSum;
        return 32 * steps;
    }
}
