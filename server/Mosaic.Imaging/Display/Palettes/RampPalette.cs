using System.Runtime.CompilerServices;
using Mosaic.Imaging.Display.Colors;

namespace Mosaic.Imaging.Display.Palettes;

/// <summary>
/// A palette of our own: straight runs in sRGB between a few anchor colours at even spacing. In each anchor no
/// channel is below the one before, so every channel and hence the luminance never falls along the ramp.
/// </summary>
public sealed record RampPalette : IPalette
{
    private readonly Rgb[] _anchors;
    private readonly Lazy<Rgb> _masked;

    private RampPalette(string name, params Rgb[] anchors)
    {
        Name = name;
        _anchors = anchors;
        _masked = new Lazy<Rgb>(() => MaskedColors.FarthestFrom(this));
    }

    /// <summary>Black through deep red and orange to pale yellow, like cooling embers in reverse.</summary>
    public static RampPalette Ember { get; } = new("ember",
        new Rgb(0, 0, 0), new Rgb(96, 8, 4), new Rgb(178, 48, 8), new Rgb(232, 124, 24), new Rgb(250, 204, 110), new Rgb(255, 248, 220));

    /// <summary>Black through night blue and teal to ice white.</summary>
    public static RampPalette Glacier { get; } = new("glacier",
        new Rgb(0, 0, 0), new Rgb(8, 18, 82), new Rgb(16, 78, 140), new Rgb(40, 150, 176), new Rgb(140, 212, 218), new Rgb(236, 250, 252));

    /// <summary>Black through forest green and olive to pale straw.</summary>
    public static RampPalette Lichen { get; } = new("lichen",
        new Rgb(0, 0, 0), new Rgb(14, 44, 18), new Rgb(48, 96, 28), new Rgb(124, 154, 40), new Rgb(206, 210, 110), new Rgb(248, 246, 214));

    public string Name { get; }

    public string CanonicalKey => Name;

    public bool IsGray => false;

    public Rgb DefaultMaskedColor => _masked.Value;

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public Rgb Color(double t)
    {
        var x = Math.Clamp(double.IsNaN(t) ? 0 : t, 0, 1) * (_anchors.Length - 1);
        var k = Math.Min((int)x, _anchors.Length - 2);
        var f = x - k;
        Rgb a = _anchors[k], b = _anchors[k + 1];
        return Rgb.FromUnit((a.R + f * (b.R - a.R)) / 255, (a.G + f * (b.G - a.G)) / 255, (a.B + f * (b.B - a.B)) / 255);
    }

    public bool Equals(RampPalette? other) => other is not null && Name == other.Name;

    public override int GetHashCode() => Name.GetHashCode(StringComparison.Ordinal);
}
