namespace Mosaic.Server.Sky;

/// <summary>
/// One coordinate line across a view: its value in degrees (ICRS), its label, the polylines that draw it (broken
/// where it leaves the projection's domain or the view) and where its label goes (null when nowhere fits).
/// </summary>
public sealed record GridLine(GridAxis Axis, double Value, string Label, IReadOnlyList<IReadOnlyList<PixelPoint>> Segments, PixelPoint? LabelAt);
