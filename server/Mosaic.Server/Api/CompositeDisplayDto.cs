namespace Mosaic.Server.Api;

/// <summary>
/// A colour composite resolved for its bands: canonical key, mode ("lupton" or "each"), the band and HDU of each
/// channel (keys red, green, blue), the channel weights, the masked colour, and either the Lupton parameters or
/// each channel's resolved display (keys red, green, blue).
/// </summary>
public sealed record CompositeDisplayDto(
    string Key,
    string Mode,
    IReadOnlyDictionary<string, string> Bands,
    string Hdu,
    double[] Scale,
    string Masked,
    LuptonDto? Lupton,
    IReadOnlyDictionary<string, DisplayDto>? Channels);
