namespace Mosaic.Server.Api;

/// <summary>
/// One grid line: axis "ra" or "dec", its value in degrees, its label, polylines of [x, y] 1-based pixel positions,
/// and the [x, y] point for its label (null where none fits).
/// </summary>
public sealed record GridLineDto(string Axis, double Value, string Label, IReadOnlyList<IReadOnlyList<double[]>> Segments, double[]? LabelAt);
