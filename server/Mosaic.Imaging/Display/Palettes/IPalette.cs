namespace Mosaic.Imaging.Display.Palettes;

/// <summary>
/// Maps a stretched t in [0, 1] to the 8-bit level written for a pixel. Evaluated only while a tone map is compiled.
/// Must be monotone in t (either way) so the tone map can bound its table error.
/// </summary>
public interface IPalette
{
    /// <summary>Stable text for this palette.</summary>
    string CanonicalKey { get; }

    byte Level(double t);
}
