namespace Mosaic.Server.Api;

/// <summary>A band: File is its first file's name, Files all of them; Canvas is null where its field has no whole-field canvas.</summary>
public sealed record BandDto(string Name, string File, IReadOnlyList<string> Files, string Version, IReadOnlyList<HduDto> Hdus, CanvasDto? Canvas, string? Error);
