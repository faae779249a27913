using System.Runtime.CompilerServices;
using Mosaic.Imaging.Display.Colors;

namespace Mosaic.Imaging.Display.Palettes;

/// <summary>DN = round(255 t), black at the lower limit.</summary>
public sealed record GrayPalette : IPalette
{
    public const string PaletteName = "gray";

    public string CanonicalKey => PaletteName;

    public string Name => PaletteName;

    public bool IsGray => true;

    /// <summary>Magenta: far from every gray (chroma about 115 in CIELAB).</summary>
    public Rgb DefaultMaskedColor => new(255, 0, 255);

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public Rgb Color(double t)
    {
        var level = GrayLevel.Of(t);
        return new Rgb(level, level, level);
    }
}
