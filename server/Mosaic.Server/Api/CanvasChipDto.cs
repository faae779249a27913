namespace Mosaic.Server.Api;

/// <summary>A chip on the canvas: its HDU index, name and closed outline as [x, y] pairs in 1-based canvas pixels.</summary>
public sealed record CanvasChipDto(int Hdu, string Name, IReadOnlyList<double[]> Outline);
