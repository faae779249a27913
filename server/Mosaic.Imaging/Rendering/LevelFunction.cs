using System.Runtime.CompilerServices;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;

namespace Mosaic.Imaging.Rendering;

/// <summary>
/// The exact level of u in double, used only while compiling: the gray DN for a gray palette, else the palette
/// index 1 + round(254 t) (index 0 is kept for masked pixels). Monotone in u either way.
/// </summary>
internal sealed class LevelFunction(IStretchCurve curve, IPalette palette)
{
    private readonly bool _gray = palette.IsGray;

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public byte At(double u)
    {
        var t = curve.Map(u);
        if (_gray) return palette.Color(t).R;
        return (byte)(1 + Math.Round(254 * Math.Clamp(double.IsNaN(t) ? 0 : t, 0, 1), MidpointRounding.AwayFromZero));
    }
}
