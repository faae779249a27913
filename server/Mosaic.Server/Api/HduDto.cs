namespace Mosaic.Server.Api;

/// <summary>An image HDU. Sky is null when it has no usable celestial WCS, and SkyError then says why.</summary>
public sealed record HduDto(int Index, string Name, int Width, int Height, int Bitpix, string? Bunit, int MaxZoom, PyramidStatusDto Pyramid,
    HduSkyDto? Sky, string? SkyError);
