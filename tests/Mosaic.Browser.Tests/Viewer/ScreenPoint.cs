namespace Mosaic.Browser.Tests.Viewer;

/// <summary>A point relative to the image view's top-left corner, in CSS pixels.</summary>
public sealed record ScreenPoint(double X, double Y);
