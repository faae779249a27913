using System.Runtime.CompilerServices;
namespace Mosaic.Imaging.Encoding;

/// <summary>
/// Length-limited canonical Huffman codes as deflate writes them (RFC 1951, 3.2.2), bit-reversed for its
/// least-significant-bit-first packing. Lengths come from a plain Huffman tree; where the tree is deeper than the
/// limit, frequencies are halved (keeping every used symbol) and the tree rebuilt, which converges in a few steps.
/// </summary>
internal static class HuffmanCode
{
    private const int SymbolBits = 9; // deflate's largest alphabet has 288 symbols

    /// <summary>Code lengths for freqs (0 for unused symbols); at least two symbols always get a code, so the code is complete.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void Lengths(ReadOnlySpan<long> frequencies, int maxLength, Span<byte> lengths)
    {
        var n = frequencies.Length;
        if (n > 1 << SymbolBits) throw new ArgumentException($"at most {1 << SymbolBits} symbols, not {n}", nameof(frequencies));
        Span<long> f = stackalloc long[n];
        frequencies.CopyTo(f);
        var used = 0;
        for (var i = 0; i < n; i++) if (f[i] > 0) used++;
        // A complete code needs two symbols: lend a count to the first unused ones.
        for (var i = 0; used < 2 && i < n; i++)
            if (f[i] == 0) { f[i] = 1; used++; }
        Span<int> parent = stackalloc int[2 * n];
        Span<long> weight = stackalloc long[2 * n];
        Span<int> order = stackalloc int[n];
        Span<long> keys = stackalloc long[n];
        Span<int> depth = stackalloc int[2 * n];
        while (true)
        {
            var leaves = 0;
            // Leaves sorted by weight, ties by symbol: one key each, weight above the symbol's 9 bits.
            for (var i = 0; i < n; i++) if (f[i] > 0) keys[leaves++] = (f[i] << SymbolBits) | (long)i;
            keys[..leaves].Sort();
            var sorted = order[..leaves];
            for (var i = 0; i < leaves; i++) sorted[i] = (int)(keys[i] & ((1 << SymbolBits) - 1));
            // Two-queue construction: leaves in order, then internal nodes in the order made (also sorted).
            for (var i = 0; i < leaves; i++) weight[i] = f[sorted[i]];
            int leaf = 0, node = leaves, made = leaves;
            while (made < 2 * leaves - 1)
            {
                var a = Take(ref leaf, ref node, leaves, made, weight);
                var b = Take(ref leaf, ref node, leaves, made, weight);
                weight[made] = weight[a] + weight[b];
                parent[a] = made;
                parent[b] = made;
                made++;
            }
            var root = made - 1;
            depth[root] = 0;
            var deepest = 0;
            for (var k = root - 1; k >= 0; k--)
            {
                depth[k] = depth[parent[k]] + 1;
                if (k < leaves && depth[k] > deepest) deepest = depth[k];
            }
            if (deepest <= maxLength)
            {
                lengths.Clear();
                for (var i = 0; i < leaves; i++) lengths[sorted[i]] = (byte)depth[i];
                return;
            }
            for (var i = 0; i < n; i++) if (f[i] > 0) f[i] = (f[i] + 1) / 2;
        }
    }

    /// <summary>Canonical codes for the lengths, bit-reversed (RFC 1951, 3.2.2).</summary>
    public static void Codes(ReadOnlySpan<byte> lengths, Span<uint> codes)
    {
        Span<int> count = stackalloc int[16];
        foreach (var l in lengths) count[l]++;
        count[0] = 0;
        Span<uint> next = stackalloc uint[16];
        uint code = 0;
        for (var bits = 1; bits < 16; bits++)
        {
            code = (code + (uint)count[bits - 1]) << 1;
            next[bits] = code;
        }
        for (var i = 0; i < lengths.Length; i++)
        {
            var l = lengths[i];
            codes[i] = l == 0 ? 0 : Reverse(next[l]++, l);
        }
    }

    private static int Take(ref int leaf, ref int node, int leaves, int made, Span<long> weight)
    {
        if (leaf < leaves && (node >= made || weight[leaf] <= weight[node])) return leaf++;
        return node++;
    }

    // The 16 low bits reversed by swapping ever smaller halves, then moved down to the code's length (at most 16).
    private static uint Reverse(uint code, int length)
    {
        code = ((code >> 1) & 0x5555) | ((code & 0x5555) << 1);
        code = ((code >> 2) & 0x3333) | ((code & 0x3333) << 2);
        code = ((code >> 4) & 0x0F0F) | ((code & 0x0F0F) << 4);
        code = ((code >> 8) & 0x00FF) | ((code & 0x00FF) << 8);
        return code >> (16 - length);
    }
}
