namespace Mosaic.Browser.Tests.Viewer;

/// <summary>
/// A marker as the page drew it: its list index, the FITS position (1-based, of the image shown) and outline
/// ([] for a point) it was drawn at, and where its centre mark is on screen, relative to the image view.
/// </summary>
public sealed record DrawnMarker(int Index, double X, double Y, IReadOnlyList<(double X, double Y)> Outline, ScreenPoint Screen);
