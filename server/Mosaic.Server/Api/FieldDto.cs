namespace Mosaic.Server.Api;

/// <summary>
/// A field as the API lists it: width, height and hdus are those of the default band and HDU; problems lists the
/// files that cannot be shown (the rest is served).
/// </summary>
public sealed record FieldDto(
    string Id,
    IReadOnlyList<BandDto> Bands,
    int? Width,
    int? Height,
    IReadOnlyList<HduDto> Hdus,
    string? DefaultBand,
    int? DefaultHdu,
    string? Error,
    IReadOnlyList<FileProblemDto> Problems);
