namespace Mosaic.Server.Api;

public sealed record PyramidStatusDto(string State, double Progress, string? Error);
