using System.Runtime.CompilerServices;
namespace Mosaic.Imaging.Rendering;

/// <summary>Expands gray levels to r, g, b triples, with one opaque colour where the value is NaN.</summary>
internal static class GrayRgb
{
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public static void Expand(ReadOnlySpan<byte> levels, ReadOnlySpan<float> values, Span<byte> rgb, byte r, byte g, byte b)
    {
        if (levels.Length != values.Length) throw new ArgumentException("levels and values must be the same length", nameof(levels));
        if (rgb.Length < 3 * values.Length) throw new ArgumentException("rgb must hold three bytes a pixel", nameof(rgb));
        for (var i = 0; i < values.Length; i++)
        {
            var o = 3 * i;
            if (float.IsNaN(values[i]))
            {
                rgb[o] = r;
                rgb[o + 1] = g;
                rgb[o + 2] = b;
            }
            else
            {
                var l = levels[i];
                rgb[o] = l;
                rgb[o + 1] = l;
                rgb[o + 2] = l;
            }
        }
    }
}
