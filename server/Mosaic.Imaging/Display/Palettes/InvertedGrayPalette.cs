using System.Runtime.CompilerServices;
using Mosaic.Imaging.Display.Colors;

namespace Mosaic.Imaging.Display.Palettes;

/// <summary>DN = 255 - round(255 t): white at the lower limit, dark sources on a light sky.</summary>
public sealed record InvertedGrayPalette : IPalette
{
    public const string PaletteName = "gray-inv";

    public string CanonicalKey => PaletteName;

    public string Name => PaletteName;

    public bool IsGray => true;

    public Rgb DefaultMaskedColor => new(255, 0, 255);

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public Rgb Color(double t)
    {
        var level = (byte)(255 - GrayLevel.Of(t));
        return new Rgb(level, level, level);
    }
}
