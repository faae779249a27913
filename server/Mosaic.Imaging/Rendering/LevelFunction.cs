using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;

namespace Mosaic.Imaging.Rendering;

/// <summary>The exact level of u: palette over stretch, in double. Used only while compiling.</summary>
internal sealed class LevelFunction(IStretchCurve curve, IPalette palette)
{
    public byte At(double u) => palette.Level(curve.Map(u));
}
