namespace Mosaic.Server.Api;

/// <summary>A chip left off the canvas, still served on its own, and why.</summary>
public sealed record ExcludedChipDto(int Hdu, string Name, string Reason);
