using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Colors;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;

namespace Mosaic.Imaging.Rendering;

/// <summary>
/// A display setting resolved for one band, as a client needs it to draw a colour bar and limit markers: limits,
/// the stretch's field-dependent parameters, and 256 (value, colour) pairs at t = i / 255.
/// </summary>
public sealed class ResolvedDisplay
{
    public const int ColorbarLength = 256;

    public ResolvedDisplay(string canonicalKey, ValueRange limits, IStretchCurve curve, IPalette palette, MaskedColor masked)
    {
        ArgumentNullException.ThrowIfNull(canonicalKey);
        Curve = curve ?? throw new ArgumentNullException(nameof(curve), "curve must be given");
        Palette = palette ?? throw new ArgumentNullException(nameof(palette), "palette must be given");
        CanonicalKey = canonicalKey;
        Lo = limits.Lo;
        Hi = limits.Hi;
        Masked = masked;
        var values = new double[ColorbarLength];
        var colors = new Rgb[ColorbarLength];
        for (var i = 0; i < ColorbarLength; i++)
        {
            var t = i / (double)(ColorbarLength - 1);
            values[i] = limits.Lo + curve.Inverse(t) * limits.Width;
            colors[i] = palette.Color(t);
        }
        // Ends exactly at the limits, free of rounding in the inverse.
        values[0] = limits.Lo;
        values[^1] = limits.Hi;
        ColorbarValues = values;
        Colors = colors;
        PaletteParameters = palette is CubehelixPalette ch
            ? new Dictionary<string, double>
            {
                ["start"] = ch.Parameters.Start,
                ["rotations"] = ch.Parameters.Rotations,
                ["hue"] = ch.Parameters.Hue,
                ["gamma"] = ch.Parameters.Gamma,
            }
            : new Dictionary<string, double>();
    }

    public string CanonicalKey { get; }

    public double Lo { get; }

    public double Hi { get; }

    /// <summary>The resolved curve; its Name and Parameters (soft and pivot as physical numbers for asinh) describe the stretch.</summary>
    public IStretchCurve Curve { get; }

    public string StretchName => Curve.Name;

    public IReadOnlyDictionary<string, double> StretchParameters => Curve.Parameters;

    public IPalette Palette { get; }

    public string PaletteName => Palette.Name;

    /// <summary>Cubehelix: start, rotations, hue, gamma; empty for the other palettes.</summary>
    public IReadOnlyDictionary<string, double> PaletteParameters { get; }

    public MaskedColor Masked { get; }

    /// <summary>Physical value v_i whose stretched t is i / 255 (the inverse of the stretch); non-decreasing, from Lo to Hi.</summary>
    public double[] ColorbarValues { get; }

    /// <summary>The palette's colour at t = i / 255.</summary>
    public Rgb[] Colors { get; }
}
