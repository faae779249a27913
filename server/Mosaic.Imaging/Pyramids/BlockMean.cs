using System.Numerics;
using System.Runtime.CompilerServices;

namespace Mosaic.Imaging.Pyramids;

/// <summary>The NaN-aware 2x2 mean that builds each level from the one below it.</summary>
internal static class BlockMean
{
    /// <summary>
    /// parent[i] = mean of the finite values among top[2i], top[2i+1], bottom[2i], bottom[2i+1] (column 2i+1 only
    /// where it exists); NaN where none is finite. A missing row is passed as a row of NaN.
    /// </summary>
    // Optimised at first call: a build runs a second or two, and tier-0 code here (Vector<T> calls not inlined) would
    // cost several times the tuned loop until tiering caught up.
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void Reduce(ReadOnlySpan<float> top, ReadOnlySpan<float> bottom, Span<float> parent)
    {
        var n = top.Length;
        if (bottom.Length != n || parent.Length != (n + 1) / 2)
            throw new ArgumentException($"rows of {top.Length} and {bottom.Length} pixels cannot reduce into {parent.Length}");
        var i = 0;
        if (Vector.IsHardwareAccelerated)
        {
            var lanes = Vector<float>.Count;
            var one = Vector<float>.One;
            for (; 2 * (i + lanes) <= n; i += lanes)
            {
                var c = 2 * i;
                var t0 = new Vector<float>(top[c..]);
                var t1 = new Vector<float>(top[(c + lanes)..]);
                var b0 = new Vector<float>(bottom[c..]);
                var b1 = new Vector<float>(bottom[(c + lanes)..]);
                var mt0 = FiniteMask(t0);
                var mt1 = FiniteMask(t1);
                var mb0 = FiniteMask(b0);
                var mb1 = FiniteMask(b1);
                var sum = PairwiseAdd((t0 & mt0) + (b0 & mb0), (t1 & mt1) + (b1 & mb1));
                var count = PairwiseAdd((one & mt0) + (one & mb0), (one & mt1) + (one & mb1));
                // 0 / 0 is NaN: a block without a finite child.
                (sum / count).CopyTo(parent[i..]);
            }
        }
        for (; i < parent.Length; i++)
        {
            var c = 2 * i;
            float sum = 0, count = 0;
            Accumulate(top[c], bottom[c], ref sum, ref count);
            if (c + 1 < n)
            {
                float sum1 = 0;
                Accumulate(top[c + 1], bottom[c + 1], ref sum1, ref count);
                sum += sum1;
            }
            parent[i] = sum / count;
        }
    }

    private static void Accumulate(float top, float bottom, ref float sum, ref float count)
    {
        if (float.IsFinite(top)) { sum += top; count++; }
        if (float.IsFinite(bottom)) { sum += bottom; count++; }
    }

    /// <summary>All ones where v is finite: v - v is 0 there and NaN for NaN and ±inf.</summary>
    private static Vector<float> FiniteMask(Vector<float> v) => Vector.AsVectorSingle(Vector.Equals(v - v, Vector<float>.Zero));

    /// <summary>[a0+a1, a2+a3, …, b0+b1, …]: the odd lane of each 64-bit pair shifted onto the even one, then the even lanes gathered by narrowing.</summary>
    private static Vector<float> PairwiseAdd(Vector<float> a, Vector<float> b)
    {
        var sa = a + Vector.AsVectorSingle(Vector.ShiftRightLogical(Vector.AsVectorUInt64(a), 32));
        var sb = b + Vector.AsVectorSingle(Vector.ShiftRightLogical(Vector.AsVectorUInt64(b), 32));
        return Vector.AsVectorSingle(Vector.Narrow(Vector.AsVectorUInt64(sa), Vector.AsVectorUInt64(sb)));
    }
}
