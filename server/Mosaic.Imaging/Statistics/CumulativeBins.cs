namespace Mosaic.Imaging.Statistics;

/// <summary>The compact, read-only form of a histogram: its non-empty finite bins in order with running totals, so a quantile is a binary search.</summary>
internal sealed class CumulativeBins
{
    public CumulativeBins(uint[] bins, long[] cumulative)
    {
        Bins = bins;
        Cumulative = cumulative;
    }

    /// <summary>Non-empty finite bins, strictly increasing.</summary>
    public uint[] Bins { get; }

    /// <summary>Cumulative[i] = pixels in Bins[0..i], inclusive.</summary>
    public long[] Cumulative { get; }

    public long Total => Cumulative.Length == 0 ? 0 : Cumulative[^1];

    public long CountAt(int index) => Cumulative[index] - (index == 0 ? 0 : Cumulative[index - 1]);

    public long Before(int index) => index == 0 ? 0 : Cumulative[index - 1];

    /// <summary>Index of the first bin whose inclusive running total exceeds <paramref name="rank"/>.</summary>
    public int IndexOfRank(long rank)
    {
        int lo = 0, hi = Cumulative.Length - 1;
        while (lo < hi)
        {
            var mid = (lo + hi) >>> 1;
            if (Cumulative[mid] > rank) hi = mid; else lo = mid + 1;
        }
        return lo;
    }

    /// <summary>Index of <paramref name="bin"/> if present, else the bitwise complement of where it would go.</summary>
    public int IndexOfBin(uint bin) => Array.BinarySearch(Bins, bin);

    /// <summary>The non-empty bins of dense counts within [firstBin, lastBin], the range that holds every finite value.</summary>
    public static CumulativeBins FromDense(ReadOnlySpan<long> counts, int firstBin, int lastBin)
    {
        var bins = new List<uint>();
        var cumulative = new List<long>();
        long running = 0;
        for (var b = firstBin; b <= lastBin; b++)
        {
            var c = counts[b];
            if (c == 0) continue;
            running += c;
            bins.Add((uint)b);
            cumulative.Add(running);
        }
        return new CumulativeBins(bins.ToArray(), cumulative.ToArray());
    }
}
