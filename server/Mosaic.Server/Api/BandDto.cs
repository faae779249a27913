namespace Mosaic.Server.Api;

public sealed record BandDto(string Name, string File, string Version, IReadOnlyList<HduDto> Hdus, string? Error);
