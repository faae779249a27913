namespace Mosaic.Server.Api;

public sealed record HduDto(int Index, string Name, int Width, int Height, int Bitpix, string? Bunit, int MaxZoom, PyramidStatusDto Pyramid);
