namespace Mosaic.Demo.Randomness;

/// <summary>The independent random streams of one field; the values are part of the output's identity, never reorder them.</summary>
internal enum RandomStream : ulong
{
    Camera = 0x11,
    Stars = 0x22,
    BrightStars = 0x33,
    Galaxies = 0x44,
    Nebula = 0x55,
    Defects = 0x66,
    PixelNoise = 0x77,
}
