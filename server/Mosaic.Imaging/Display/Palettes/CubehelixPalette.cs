using System.Runtime.CompilerServices;
using Mosaic.Imaging.Display.Colors;

namespace Mosaic.Imaging.Display.Palettes;

/// <summary>
/// Cubehelix (Green 2011): a helix around the gray diagonal of the RGB cube whose brightness rises as λ^γ, so it
/// stays monotone in perceived brightness while the hue turns. Channels that leave [0, 1] (large hue) are clipped.
/// </summary>
public sealed record CubehelixPalette : IPalette
{
    public const string PaletteName = "cubehelix";

    private readonly Lazy<Rgb> _masked;

    public CubehelixPalette(double start, double rotations, double hue, double gamma)
        : this(new CubehelixParameters(start, rotations, hue, gamma))
    {
    }

    public CubehelixPalette(CubehelixParameters parameters)
    {
        Parameters = parameters ?? throw new ArgumentNullException(nameof(parameters), "cubehelix parameters must be given");
        _masked = new Lazy<Rgb>(() => MaskedColors.FarthestFrom(this));
    }

    public CubehelixPalette() : this(CubehelixParameters.Default)
    {
    }

    public CubehelixParameters Parameters { get; }

    public string CanonicalKey => $"cubehelix({KeyText.Number(Parameters.Start)},{KeyText.Number(Parameters.Rotations)},{KeyText.Number(Parameters.Hue)},{KeyText.Number(Parameters.Gamma)})";

    public string Name => PaletteName;

    public bool IsGray => Parameters.Hue == 0;

    public Rgb DefaultMaskedColor => _masked.Value;

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public Rgb Color(double t)
    {
        var lambda = Math.Clamp(double.IsNaN(t) ? 0 : t, 0, 1);
        var brightness = Math.Pow(lambda, Parameters.Gamma);
        var amplitude = Parameters.Hue * brightness * (1 - brightness) / 2;
        var phi = 2 * Math.PI * (Parameters.Start / 3 + Parameters.Rotations * lambda);
        var (sin, cos) = Math.SinCos(phi);
        // The paper's rotation of (cos φ, sin φ) into RGB.
        var r = brightness + amplitude * (-0.14861 * cos + 1.78277 * sin);
        var g = brightness + amplitude * (-0.29227 * cos - 0.90649 * sin);
        var b = brightness + amplitude * (1.97294 * cos);
        return Rgb.FromUnit(r, g, b);
    }

    public bool Equals(CubehelixPalette? other) => other is not null && Parameters.Equals(other.Parameters);

    public override int GetHashCode() => Parameters.GetHashCode();
}
