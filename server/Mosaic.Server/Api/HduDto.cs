using System.Text.Json.Serialization;

namespace Mosaic.Server.Api;

/// <summary>
/// An image HDU. Sky is null when it has no usable celestial WCS, and SkyError then says why. File is the file
/// holding it; FitsIndex its HDU number inside that file, given only where it differs from Index (a band of several files).
/// </summary>
public sealed record HduDto(int Index, string Name, int Width, int Height, int Bitpix, string? Bunit, int MaxZoom, PyramidStatusDto Pyramid,
    HduSkyDto? Sky, string? SkyError, string? File,
    [property: JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] int? FitsIndex = null);
