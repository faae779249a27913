namespace Mosaic.Browser.Tests.Viewer;

/// <summary>A grid label as drawn: axis, value in degrees, text, and the centre of its box on screen.</summary>
public sealed record GridLabel(string Axis, double Value, string Text, ScreenPoint Centre);
