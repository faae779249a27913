using Mosaic.Imaging.Encoding;

namespace Mosaic.Imaging.Tests.Encoding;

/// <summary>
/// Length-limited code lengths: within the limit, complete (Kraft–McMillan sum exactly 1, which RFC 1951's
/// canonical codes need to decode every bit string: common practice), and as cheap as an unlimited Huffman code
/// where that code already fits (its cost computed here independently, as the sum of the merged weights).
/// </summary>
public sealed class HuffmanCodeTests
{
    [Theory]
    [InlineData(14, 257)] // the literal code
    [InlineData(7, 19)] // the code-length code (RFC 1951, 3.2.7)
    public void Fibonacci_counts_get_a_complete_code_within_the_limit(int maxLength, int symbols)
    {
        // Counts growing as Fibonacci numbers make the deepest possible Huffman tree: one level per symbol.
        var frequencies = new long[symbols];
        long a = 1, b = 1;
        for (var s = 0; s < Math.Min(symbols, 30); s++)
        {
            frequencies[symbols - 1 - s] = a;
            (a, b) = (b, a + b);
        }
        var lengths = new byte[symbols];
        HuffmanCode.Lengths(frequencies, maxLength, lengths);
        for (var s = 0; s < symbols; s++)
        {
            if (frequencies[s] == 0) Assert.Equal(0, lengths[s]);
            else Assert.InRange(lengths[s], 1, maxLength);
        }
        Assert.Equal(1.0, KraftSum(lengths));
    }

    [Fact]
    public void Counts_whose_tree_fits_get_an_optimal_huffman_code()
    {
        var rng = new Random(21);
        var frequencies = new long[257];
        for (var s = 0; s < 200; s++) frequencies[s] = 1 + rng.Next(5000);
        var lengths = new byte[257];
        HuffmanCode.Lengths(frequencies, 14, lengths);
        Assert.Equal(1.0, KraftSum(lengths));
        Assert.Equal(HuffmanCost(frequencies), frequencies.Select((f, s) => f * lengths[s]).Sum());
    }

    [Fact]
    public void Canonical_codes_match_the_worked_example_of_RFC_1951()
    {
        // RFC 1951, 3.2.2: lengths (3, 3, 3, 3, 3, 2, 4, 4) for A..H give codes 010, 011, 100, 101, 110, 00, 1110,
        // 1111 (most significant bit first); deflate packs them from the least significant bit, hence reversed.
        byte[] lengths = [3, 3, 3, 3, 3, 2, 4, 4];
        string[] expected = ["010", "011", "100", "101", "110", "00", "1110", "1111"];
        var codes = new uint[8];
        HuffmanCode.Codes(lengths, codes);
        for (var s = 0; s < 8; s++)
        {
            var reversed = new string(expected[s].Reverse().ToArray());
            Assert.Equal(Convert.ToUInt32(reversed, 2), codes[s]);
        }
    }

    [Fact]
    public void Too_many_symbols_are_refused()
        => Assert.Throws<ArgumentException>(() => HuffmanCode.Lengths(new long[600], 15, new byte[600]));

    private static double KraftSum(byte[] lengths) => lengths.Where(l => l > 0).Sum(l => Math.Pow(2, -l));

    // Huffman's construction: every merge adds its weight once for each level it pushes its leaves down.
    private static long HuffmanCost(long[] frequencies)
    {
        var queue = new PriorityQueue<long, long>();
        foreach (var f in frequencies.Where(f => f > 0)) queue.Enqueue(f, f);
        long cost = 0;
        while (queue.Count > 1)
        {
            var merged = queue.Dequeue() + queue.Dequeue();
            cost += merged;
            queue.Enqueue(merged, merged);
        }
        return cost;
    }
}
