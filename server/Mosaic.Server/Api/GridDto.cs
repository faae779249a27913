namespace Mosaic.Server.Api;

/// <summary>Grid steps in degrees (null when the view has no sky position) and the lines.</summary>
public sealed record GridDto(double? RaStep, double? DecStep, IReadOnlyList<GridLineDto> Lines);
