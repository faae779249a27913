using Mosaic.Imaging.Display.Colors;

namespace Mosaic.Imaging.Display.Palettes;

/// <summary>
/// Colours for a stretched t in [0, 1]. Evaluated only while a display is compiled (256 or so times), never per
/// pixel. Every palette of the catalog is monotone in lightness, so it reads in grey and for colour-blind viewers.
/// </summary>
public interface IPalette
{
    /// <summary>Stable text for this palette and its parameters.</summary>
    string CanonicalKey { get; }

    /// <summary>The name used in URLs (gray, gray-inv, cubehelix, ...).</summary>
    string Name { get; }

    /// <summary>True where every colour is a gray (R = G = B): tiles are then written as 8-bit grayscale PNG with the gray as level.</summary>
    bool IsGray { get; }

    /// <summary>The colour at t (clamped to [0, 1]; NaN counts as 0).</summary>
    Rgb Color(double t);

    /// <summary>A colour far (in CIELAB) from every colour of this palette, so a masked pixel is never taken for a value.</summary>
    Rgb DefaultMaskedColor { get; }
}
