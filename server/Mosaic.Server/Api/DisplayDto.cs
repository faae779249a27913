namespace Mosaic.Server.Api;

/// <summary>
/// A display setting resolved for a band: its canonical key, the limits, the stretch and palette with their
/// resolved parameters (each object has "name"; asinh soft and pivot are physical numbers), the masked colour
/// ("transparent" or rrggbb) and the colour bar.
/// </summary>
public sealed record DisplayDto(
    string Key,
    string Band,
    double Lo,
    double Hi,
    IReadOnlyDictionary<string, object> Stretch,
    IReadOnlyDictionary<string, object> Palette,
    string Masked,
    ColorbarDto Colorbar,
    string? Bunit);
