namespace Mosaic.Imaging.Display.Palettes;

/// <summary>
/// The four cubehelix parameters (Green 2011, Bull. Astr. Soc. India 39, 289): start colour (0..3), rotations
/// (−10..10), hue (0..3, the amplitude of the colour swing), gamma (&gt; 0, ≤ 10). Validated on construction.
/// </summary>
public sealed record CubehelixParameters
{
    public const double DefaultStart = 0.5;
    public const double DefaultRotations = -1.5;
    public const double DefaultHue = 1.0;
    public const double DefaultGamma = 1.0;

    public CubehelixParameters(double start, double rotations, double hue, double gamma)
    {
        if (!(start >= 0 && start <= 3)) throw new ArgumentOutOfRangeException(nameof(start), start, "cubehelix start must be in [0, 3]");
        if (!(rotations >= -10 && rotations <= 10)) throw new ArgumentOutOfRangeException(nameof(rotations), rotations, "cubehelix rotations must be in [-10, 10]");
        if (!(hue >= 0 && hue <= 3)) throw new ArgumentOutOfRangeException(nameof(hue), hue, "cubehelix hue must be in [0, 3]");
        if (!(gamma > 0 && gamma <= 10)) throw new ArgumentOutOfRangeException(nameof(gamma), gamma, "cubehelix gamma must be > 0 and <= 10");
        // -0.0 and 0.0 are one setting.
        Start = start + 0.0;
        Rotations = rotations + 0.0;
        Hue = hue + 0.0;
        Gamma = gamma;
    }

    public static CubehelixParameters Default { get; } = new(DefaultStart, DefaultRotations, DefaultHue, DefaultGamma);

    public double Start { get; }
    public double Rotations { get; }
    public double Hue { get; }
    public double Gamma { get; }
}
