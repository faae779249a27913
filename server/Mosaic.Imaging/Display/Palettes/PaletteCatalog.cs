namespace Mosaic.Imaging.Display.Palettes;

/// <summary>The palettes a viewer can ask for by name, with their labels.</summary>
public static class PaletteCatalog
{
    private static readonly (string Name, string Label)[] Entries =
    [
        (GrayPalette.PaletteName, "Gray"),
        (InvertedGrayPalette.PaletteName, "Gray, inverted"),
        (CubehelixPalette.PaletteName, "Cubehelix (Green 2011)"),
        ("ember", "Ember"),
        ("glacier", "Glacier"),
        ("lichen", "Lichen"),
    ];

    /// <summary>Palette names in display order.</summary>
    public static IReadOnlyList<string> Names { get; } = Array.ConvertAll(Entries, e => e.Name);

    /// <summary>A short human label for a palette name; ArgumentException naming "palette" for an unknown name.</summary>
    public static string Label(string name)
    {
        foreach (var e in Entries)
            if (e.Name == name) return e.Label;
        throw Unknown(name);
    }

    /// <summary>
    /// The palette of that name; <paramref name="cubehelix"/> sets the cubehelix parameters (default ones when
    /// null) and is refused for other palettes. ArgumentException naming "palette" for an unknown name.
    /// </summary>
    public static IPalette Create(string name, CubehelixParameters? cubehelix = null)
    {
        ArgumentNullException.ThrowIfNull(name, "palette");
        if (cubehelix is not null && name != CubehelixPalette.PaletteName)
            throw new ArgumentException($"cubehelix parameters apply only to palette=cubehelix, not '{name}'", "palette");
        return name switch
        {
            GrayPalette.PaletteName => new GrayPalette(),
            InvertedGrayPalette.PaletteName => new InvertedGrayPalette(),
            CubehelixPalette.PaletteName => new CubehelixPalette(cubehelix ?? CubehelixParameters.Default),
            "ember" => RampPalette.Ember,
            "glacier" => RampPalette.Glacier,
            "lichen" => RampPalette.Lichen,
            _ => throw Unknown(name),
        };
    }

    private static ArgumentException Unknown(string name)
        => new($"palette must be one of {string.Join(", ", Names)}, not '{name}'", "palette");
}
