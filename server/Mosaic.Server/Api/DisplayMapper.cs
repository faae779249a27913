using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Rendering;

namespace Mosaic.Server.Api;

/// <summary>Resolved displays and palettes to the JSON the API documents.</summary>
public static class DisplayMapper
{
    /// <summary>The cubehelix parameters, by their query names (ranges of Green 2011's parameters as the contract bounds them).</summary>
    public static IReadOnlyList<PaletteParameterDto> CubehelixParameterList { get; } =
    [
        new("ch-start", "Start colour", 0, 3, false, CubehelixParameters.DefaultStart),
        new("ch-rot", "Rotations", -10, 10, false, CubehelixParameters.DefaultRotations),
        new("ch-hue", "Hue", 0, 3, false, CubehelixParameters.DefaultHue),
        new("ch-gamma", "Gamma", 0, 10, true, CubehelixParameters.DefaultGamma),
    ];

    public static DisplayDto ToDto(ResolvedDisplay display, string band, string? bunit)
    {
        var stretch = new Dictionary<string, object>(StringComparer.Ordinal) { ["name"] = display.StretchName };
        foreach (var (name, value) in display.StretchParameters) stretch[name] = value;
        var palette = new Dictionary<string, object>(StringComparer.Ordinal) { ["name"] = display.PaletteName };
        foreach (var (name, value) in display.PaletteParameters) palette[name] = value;
        return new DisplayDto(display.CanonicalKey, band, display.Lo, display.Hi, stretch, palette, display.Masked.CanonicalKey,
            new ColorbarDto(display.ColorbarValues, display.Colors.Select(c => c.Hex).ToArray()), bunit);
    }

    public static PaletteDto ToDto(IPalette palette)
    {
        var colors = new string[ResolvedDisplay.ColorbarLength];
        for (var i = 0; i < colors.Length; i++) colors[i] = palette.Color(i / (double)(colors.Length - 1)).Hex;
        return new PaletteDto(palette.Name, PaletteCatalog.Label(palette.Name), colors, palette.DefaultMaskedColor.Hex,
            palette is CubehelixPalette ? CubehelixParameterList : []);
    }
}
