namespace Mosaic.Server.Api;

/// <summary>A unit vector in pixel axes: x to the right, y up.</summary>
public sealed record VectorDto(double Dx, double Dy);
