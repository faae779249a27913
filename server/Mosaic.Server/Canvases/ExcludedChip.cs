namespace Mosaic.Server.Canvases;

/// <summary>A chip left off the canvas (it is still served on its own), with the reason in words.</summary>
public sealed record ExcludedChip(int Hdu, string Name, string Reason);
