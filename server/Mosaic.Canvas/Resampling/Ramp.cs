using System.Numerics;

namespace Mosaic.Canvas.Resampling;

/// <summary>Linear ramps for the per-cell interpolation of chip positions.</summary>
internal static class Ramp
{
    /// <summary>0, 1, 2, ... one per lane.</summary>
    private static readonly Vector<double> Lanes = CreateLanes();

    /// <summary>destination[m] = start + step * m.</summary>
    public static void Fill(Span<double> destination, double start, double step)
    {
        var m = 0;
        if (Vector.IsHardwareAccelerated && destination.Length >= Vector<double>.Count)
        {
            var count = Vector<double>.Count;
            var index = Lanes;
            var stride = new Vector<double>(count);
            Vector<double> first = new(start), slope = new(step);
            for (; m <= destination.Length - count; m += count)
            {
                (first + slope * index).CopyTo(destination[m..]);
                index += stride;
            }
        }
        for (; m < destination.Length; m++) destination[m] = start + step * m;
    }

    private static Vector<double> CreateLanes()
    {
        Span<double> lanes = stackalloc double[Vector<double>.Count];
        for (var k = 0; k < lanes.Length; k++) lanes[k] = k;
        return new Vector<double>(lanes);
    }
}
