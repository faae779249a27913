namespace Mosaic.Imaging.Encoding;

/// <summary>
/// Length-limited canonical Huffman codes as deflate writes them (RFC 1951, 3.2.2), bit-reversed for its
/// least-significant-bit-first packing. Lengths come from a plain Huffman tree; where the tree is deeper than the
/// limit, frequencies are halved (keeping every used symbol) and the tree rebuilt, which converges in a few steps.
/// </summary>
internal static class HuffmanCode
{
    /// <summary>Code lengths for freqs (0 for unused symbols); at least two symbols always get a code, so the code is complete.</summary>
    public static void Lengths(ReadOnlySpan<long> frequencies, int maxLength, Span<byte> lengths)
    {
        var n = frequencies.Length;
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
        Span<int> depth = stackalloc int[2 * n];
        while (true)
        {
            var leaves = 0;
            for (var i = 0; i < n; i++) if (f[i] > 0) order[leaves++] = i;
            var sorted = order[..leaves];
            // Sort leaves by weight (insertion sort over at most 288 symbols is cheap next to the data).
            for (var i = 1; i < sorted.Length; i++)
            {
                var s = sorted[i];
                var j = i - 1;
                while (j >= 0 && f[sorted[j]] > f[s]) { sorted[j + 1] = sorted[j]; j--; }
                sorted[j + 1] = s;
            }
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

    private static uint Reverse(uint code, int length)
    {
        uint r = 0;
        for (var i = 0; i < length; i++) { r = (r << 1) | (code & 1); code >>= 1; }
        return r;
    }
}
