using System.Buffers.Binary;

namespace Mosaic.Fits.Compression;

/// <summary>
/// HCOMPRESS_1 (FITS 4.0 section 10.4.4): the H-transform of the tile (sums and differences over 2 x 2 blocks,
/// repeated on the sums), its coefficients stored as bit planes of four quadrants, each plane quadtree-coded with a
/// fixed Huffman code for the 4-bit quadtree symbols (or written directly), then the signs; decoding runs the same
/// steps backwards and undoes the scaling of lossy files. Arithmetic is 64-bit, so 32-bit images cannot overflow.
/// </summary>
internal static class HCompressDecoder
{
    private static ReadOnlySpan<byte> Magic => [0xDD, 0x99];

    /// <summary>Decodes into values laid out as rows of <paramref name="rowLength"/> (the stream's second dimension is the fast one).</summary>
    public static void Decode(ReadOnlySpan<byte> input, int rows, int rowLength, Span<long> a)
    {
        if (input.Length < 25 || !input[..2].SequenceEqual(Magic)) throw new TileDataException("the HCOMPRESS_1 stream does not start with its magic code");
        var nx = BinaryPrimitives.ReadInt32BigEndian(input[2..]);
        var ny = BinaryPrimitives.ReadInt32BigEndian(input[6..]);
        var scale = BinaryPrimitives.ReadInt32BigEndian(input[10..]);
        var sumAll = BinaryPrimitives.ReadInt64BigEndian(input[14..]);
        if (nx != rows || ny != rowLength)
            throw new TileDataException($"the HCOMPRESS_1 stream holds {nx} x {ny} values, but the tile is {rows} x {rowLength}");
        var planes = input.Slice(22, 3);
        if (planes[0] > 64 || planes[1] > 64 || planes[2] > 64) throw new TileDataException("the HCOMPRESS_1 stream gives more than 64 bit planes");

        var bits = new HBitReader(input, 25);
        a.Clear();
        int nx2 = (nx + 1) / 2, ny2 = (ny + 1) / 2;
        QuadtreeDecode(ref bits, a, 0, ny, nx2, ny2, planes[0]);
        QuadtreeDecode(ref bits, a, ny2, ny, nx2, ny / 2, planes[1]);
        QuadtreeDecode(ref bits, a, ny * nx2, ny, nx / 2, ny2, planes[1]);
        QuadtreeDecode(ref bits, a, ny * nx2 + ny2, ny, nx / 2, ny / 2, planes[2]);
        if (bits.Read(4) != 0) throw new TileDataException("the HCOMPRESS_1 stream lacks its end code after the bit planes");

        // The signs follow, from the next whole byte.
        bits.AlignToByte();
        for (var i = 0; i < a.Length; i++)
            if (a[i] != 0 && bits.Read(1) != 0) a[i] = -a[i];
        a[0] = sumAll;

        if (scale > 1)
            for (var i = 0; i < a.Length; i++) a[i] *= scale;
        InverseTransform(a, nx, ny);
    }

    /// <summary>Smallest k with 2^k ≥ n.</summary>
    private static int CeilLog2(int n)
    {
        var k = 0;
        while ((1L << k) < n) k++;
        return k;
    }

    private static void QuadtreeDecode(ref HBitReader bits, Span<long> a, int offset, int n, int nqx, int nqy, int planeCount)
    {
        if (nqx <= 0 || nqy <= 0)
        {
            // An empty quadrant still carries its plane codes when it has planes.
            if (planeCount == 0) return;
        }
        var log2n = CeilLog2(Math.Max(nqx, nqy));
        var scratch = new byte[Math.Max(1, ((nqx + 1) / 2) * ((nqy + 1) / 2) * 4 + 4)];
        for (var bit = planeCount - 1; bit >= 0; bit--)
        {
            var format = bits.Read(4);
            if (format == 0)
            {
                // Written directly: four bits of the plane per nybble.
                var count = ((nqx + 1) / 2) * ((nqy + 1) / 2);
                for (var i = 0; i < count; i++) scratch[i] = (byte)bits.Read(4);
                InsertBits(scratch, nqx, nqy, a, offset, n, bit);
            }
            else if (format != 0xF) throw new TileDataException($"the HCOMPRESS_1 stream has the unknown bit-plane format {format}");
            else
            {
                scratch[0] = (byte)bits.Huffman();
                int sx = 1, sy = 1, fx = nqx, fy = nqy;
                var c = 1 << log2n;
                for (var k = 1; k < log2n; k++)
                {
                    // Sizes of the successive expansions: n[k-1] = (n[k] + 1) / 2, ending at nqx, nqy.
                    c >>= 1;
                    sx <<= 1;
                    sy <<= 1;
                    if (fx <= c) sx--; else fx -= c;
                    if (fy <= c) sy--; else fy -= c;
                    Expand(ref bits, scratch, sx, sy);
                }
                InsertBits(scratch, nqx, nqy, a, offset, n, bit);
            }
        }
    }

    /// <summary>One quadtree step: each 4-bit symbol of the (nx+1)/2 x (ny+1)/2 level becomes a 2 x 2 block, and every non-zero cell reads its own symbol.</summary>
    private static void Expand(ref HBitReader bits, byte[] b, int nx, int ny)
    {
        Copy(b, nx, ny);
        for (var i = nx * ny - 1; i >= 0; i--)
            if (b[i] != 0) b[i] = (byte)bits.Huffman();
    }

    /// <summary>Expands symbols in place from a (nx+1)/2 x (ny+1)/2 grid to an nx x ny grid of bits (row stride ny).</summary>
    private static void Copy(byte[] b, int nx, int ny)
    {
        int nx2 = (nx + 1) / 2, ny2 = (ny + 1) / 2, n = ny;
        var k = ny2 * (nx2 - 1) + ny2 - 1;
        for (var i = nx2 - 1; i >= 0; i--)
        {
            var s = 2 * (n * i + ny2 - 1);
            for (var j = ny2 - 1; j >= 0; j--, k--, s -= 2) b[s] = b[k];
        }
        int ii;
        for (ii = 0; ii < nx - 1; ii += 2)
        {
            int s00 = n * ii, s10 = s00 + n, j;
            for (j = 0; j < ny - 1; j += 2, s00 += 2, s10 += 2)
            {
                var v = b[s00];
                b[s10 + 1] = (byte)(v & 1);
                b[s10] = (byte)((v >> 1) & 1);
                b[s00 + 1] = (byte)((v >> 2) & 1);
                b[s00] = (byte)((v >> 3) & 1);
            }
            if (j < ny)
            {
                var v = b[s00];
                b[s10] = (byte)((v >> 1) & 1);
                b[s00] = (byte)((v >> 3) & 1);
            }
        }
        if (ii < nx)
        {
            var s00 = n * ii;
            int j;
            for (j = 0; j < ny - 1; j += 2, s00 += 2)
            {
                var v = b[s00];
                b[s00 + 1] = (byte)((v >> 2) & 1);
                b[s00] = (byte)((v >> 3) & 1);
            }
            if (j < ny) b[s00] = (byte)((b[s00] >> 3) & 1);
        }
    }

    /// <summary>Sets bit plane <paramref name="bit"/> of the quadrant from the 4-bit symbols (one per 2 x 2 block).</summary>
    private static void InsertBits(byte[] symbols, int nx, int ny, Span<long> a, int offset, int n, int bit)
    {
        var plane = 1L << bit;
        var k = 0;
        int i;
        for (i = 0; i < nx - 1; i += 2)
        {
            int s00 = offset + n * i, j;
            for (j = 0; j < ny - 1; j += 2, s00 += 2, k++)
            {
                var v = symbols[k];
                if ((v & 1) != 0) a[s00 + n + 1] |= plane;
                if ((v & 2) != 0) a[s00 + n] |= plane;
                if ((v & 4) != 0) a[s00 + 1] |= plane;
                if ((v & 8) != 0) a[s00] |= plane;
            }
            if (j < ny)
            {
                var v = symbols[k++];
                if ((v & 2) != 0) a[s00 + n] |= plane;
                if ((v & 8) != 0) a[s00] |= plane;
            }
        }
        if (i < nx)
        {
            int s00 = offset + n * i, j;
            for (j = 0; j < ny - 1; j += 2, s00 += 2, k++)
            {
                var v = symbols[k];
                if ((v & 4) != 0) a[s00 + 1] |= plane;
                if ((v & 8) != 0) a[s00] |= plane;
            }
            if (j < ny && (symbols[k] & 8) != 0) a[s00] |= plane;
        }
    }

    /// <summary>The inverse H-transform with the rounding that makes it exact for integer images.</summary>
    private static void InverseTransform(Span<long> a, int nx, int ny)
    {
        var nmax = Math.Max(nx, ny);
        var log2n = CeilLog2(nmax);
        if (log2n == 0) return;
        var tmp = new long[(nmax + 1) / 2];

        var shift = 1;
        long bit0 = 1L << (log2n - 1), bit1 = bit0 << 1, bit2 = bit0 << 2;
        long mask0 = -bit0, mask1 = mask0 << 1, mask2 = mask0 << 2;
        long prnd0 = bit0 >> 1, prnd1 = bit1 >> 1, prnd2 = bit2 >> 1;
        long nrnd0 = prnd0 - 1, nrnd1 = prnd1 - 1, nrnd2 = prnd2 - 1;

        a[0] = (a[0] + (a[0] >= 0 ? prnd2 : nrnd2)) & mask2;

        int nxtop = 1, nytop = 1, nxf = nx, nyf = ny;
        var c = 1 << log2n;
        for (var k = log2n - 1; k >= 0; k--)
        {
            c >>= 1;
            nxtop <<= 1;
            nytop <<= 1;
            if (nxf <= c) nxtop--; else nxf -= c;
            if (nyf <= c) nytop--; else nyf -= c;
            if (k == 0)
            {
                nrnd0 = 0;
                shift = 2;
            }

            for (var i = 0; i < nxtop; i++) Unshuffle(a, ny * i, nytop, 1, tmp);
            for (var j = 0; j < nytop; j++) Unshuffle(a, j, nxtop, ny, tmp);

            var oddx = nxtop % 2;
            var oddy = nytop % 2;
            int ii;
            for (ii = 0; ii < nxtop - oddx; ii += 2)
            {
                int s00 = ny * ii, s10 = s00 + ny, j;
                for (j = 0; j < nytop - oddy; j += 2, s00 += 2, s10 += 2)
                {
                    long h0 = a[s00], hx = a[s10], hy = a[s00 + 1], hc = a[s10 + 1];
                    hx = (hx + (hx >= 0 ? prnd1 : nrnd1)) & mask1;
                    hy = (hy + (hy >= 0 ? prnd1 : nrnd1)) & mask1;
                    hc = (hc + (hc >= 0 ? prnd0 : nrnd0)) & mask0;
                    var lowbit0 = hc & bit0;
                    hx = hx >= 0 ? hx - lowbit0 : hx + lowbit0;
                    hy = hy >= 0 ? hy - lowbit0 : hy + lowbit0;
                    var lowbit1 = (hc ^ hx ^ hy) & bit1;
                    h0 = h0 >= 0 ? h0 + lowbit0 - lowbit1 : h0 + (lowbit0 == 0 ? lowbit1 : lowbit0 - lowbit1);
                    a[s10 + 1] = (h0 + hx + hy + hc) >> shift;
                    a[s10] = (h0 + hx - hy - hc) >> shift;
                    a[s00 + 1] = (h0 - hx + hy - hc) >> shift;
                    a[s00] = (h0 - hx - hy + hc) >> shift;
                }
                if (oddy != 0)
                {
                    long h0 = a[s00], hx = a[s10];
                    hx = (hx + (hx >= 0 ? prnd1 : nrnd1)) & mask1;
                    var lowbit1 = hx & bit1;
                    h0 = h0 >= 0 ? h0 - lowbit1 : h0 + lowbit1;
                    a[s10] = (h0 + hx) >> shift;
                    a[s00] = (h0 - hx) >> shift;
                }
            }
            if (oddx != 0)
            {
                var s00 = ny * ii;
                int j;
                for (j = 0; j < nytop - oddy; j += 2, s00 += 2)
                {
                    long h0 = a[s00], hy = a[s00 + 1];
                    hy = (hy + (hy >= 0 ? prnd1 : nrnd1)) & mask1;
                    var lowbit1 = hy & bit1;
                    h0 = h0 >= 0 ? h0 - lowbit1 : h0 + lowbit1;
                    a[s00 + 1] = (h0 + hy) >> shift;
                    a[s00] = (h0 - hy) >> shift;
                }
                if (oddy != 0) a[s00] >>= shift;
            }

            bit2 = bit1;
            bit1 = bit0;
            bit0 >>= 1;
            mask1 = mask0;
            mask0 >>= 1;
            prnd1 = prnd0;
            prnd0 >>= 1;
            nrnd1 = nrnd0;
            nrnd0 = prnd0 - 1;
        }
    }

    /// <summary>Interleaves the two halves of a strided run of n values: first half to the even places, second half to the odd.</summary>
    private static void Unshuffle(Span<long> a, int start, int n, int stride, long[] tmp)
    {
        var half = (n + 1) >> 1;
        for (int i = half, t = 0; i < n; i++, t++) tmp[t] = a[start + stride * i];
        for (var i = half - 1; i >= 0; i--) a[start + 2 * stride * i] = a[start + stride * i];
        for (int i = 1, t = 0; i < n; i += 2, t++) a[start + stride * i] = tmp[t];
    }

    /// <summary>Most-significant-bit-first reader over the stream after its header.</summary>
    private ref struct HBitReader(ReadOnlySpan<byte> data, int position)
    {
        private readonly ReadOnlySpan<byte> _data = data;
        private int _position = position;
        private int _buffer;
        private int _count;

        public int Read(int k)
        {
            var value = 0;
            for (var i = 0; i < k; i++)
            {
                if (_count == 0)
                {
                    if (_position >= _data.Length) throw new TileDataException("the HCOMPRESS_1 stream ends before the tile is complete");
                    _buffer = _data[_position++];
                    _count = 8;
                }
                value = (value << 1) | ((_buffer >> --_count) & 1);
            }
            return value;
        }

        public void AlignToByte() => _count = 0;

        /// <summary>The fixed code of the quadtree symbols (section 10.4.4).</summary>
        public int Huffman()
        {
            var c = Read(3);
            if (c < 4) return 1 << c;
            c = Read(1) | (c << 1);
            switch (c)
            {
                case 8: return 3;
                case 9: return 5;
                case 10: return 10;
                case 11: return 12;
                case 12: return 15;
            }
            c = Read(1) | (c << 1);
            switch (c)
            {
                case 26: return 6;
                case 27: return 7;
                case 28: return 9;
                case 29: return 11;
                case 30: return 13;
            }
            c = Read(1) | (c << 1);
            return c == 62 ? 0 : 14;
        }
    }
}
