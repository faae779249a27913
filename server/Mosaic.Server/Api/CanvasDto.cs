namespace Mosaic.Server.Api;

/// <summary>
/// A band's whole-field canvas (select it with hdu=canvas): its size, zoom range, pyramid progress and sky, the
/// chips placed on it with their outlines in 1-based canvas pixels, and the chips left off with the reason.
/// </summary>
public sealed record CanvasDto(int Width, int Height, int MaxZoom, PyramidStatusDto Pyramid, HduSkyDto? Sky,
    IReadOnlyList<CanvasChipDto> Chips, IReadOnlyList<ExcludedChipDto> Excluded);
