namespace Mosaic.Server.Api;

/// <summary>A band; Canvas is null where its field has no whole-field canvas.</summary>
public sealed record BandDto(string Name, string File, string Version, IReadOnlyList<HduDto> Hdus, CanvasDto? Canvas, string? Error);
