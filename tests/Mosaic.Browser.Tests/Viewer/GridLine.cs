namespace Mosaic.Browser.Tests.Viewer;

/// <summary>A drawn grid line: its axis ("ra" or "dec"), value in degrees, and points sampled along it on screen.</summary>
public sealed record GridLine(string Axis, double Value, IReadOnlyList<ScreenPoint> Points);
