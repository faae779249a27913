using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace Mosaic.Imaging.Rendering;

/// <summary>Counts NaN (masked or outside) values, so the PNG colour type is chosen before any row is written.</summary>
internal static class NanCount
{
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static long Of(ReadOnlySpan<float> values)
    {
        ref var v = ref MemoryMarshal.GetReference(values);
        var n = values.Length;
        var i = 0;
        long count = 0;
        if (Vector.IsHardwareAccelerated)
        {
            // Lanes of the mask are -1 for NaN; summed in int lanes, flushed before they could overflow.
            var lanes = Vector<int>.Zero;
            var sinceFlush = 0;
            for (; i <= n - Vector<float>.Count; i += Vector<float>.Count)
            {
                var x = Vector.LoadUnsafe(ref v, (nuint)i);
                lanes += ~Vector.Equals(x, x);
                if (++sinceFlush == int.MaxValue)
                {
                    count -= Vector.Sum(lanes);
                    lanes = Vector<int>.Zero;
                    sinceFlush = 0;
                }
            }
            count -= Vector.Sum(lanes);
        }
        for (; i < n; i++) if (float.IsNaN(values[i])) count++;
        return count;
    }
}
