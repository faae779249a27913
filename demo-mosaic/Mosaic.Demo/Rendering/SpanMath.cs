using System.Numerics;

namespace Mosaic.Demo.Rendering;

/// <summary>Small vectorised span kernels shared by the stamp renderers.</summary>
internal static class SpanMath
{
    /// <summary>destination[i] += scale × source[i].</summary>
    public static void AddScaled(ReadOnlySpan<float> source, float scale, Span<float> destination)
    {
        var n = Vector<float>.Count;
        var vs = new Vector<float>(scale);
        var i = 0;
        for (; i <= destination.Length - n; i += n)
            (new Vector<float>(destination[i..]) + vs * new Vector<float>(source[i..])).CopyTo(destination[i..]);
        for (; i < destination.Length; i++) destination[i] += scale * source[i];
    }

    /// <summary>destination[i] += source[i].</summary>
    public static void Add(ReadOnlySpan<float> source, Span<float> destination)
    {
        var n = Vector<float>.Count;
        var i = 0;
        for (; i <= destination.Length - n; i += n)
            (new Vector<float>(destination[i..]) + new Vector<float>(source[i..])).CopyTo(destination[i..]);
        for (; i < destination.Length; i++) destination[i] += source[i];
    }
}
