namespace Mosaic.Browser.Tests.Viewer;

/// <summary>A chip outline as drawn: its HDU and name (from the SVG path) and its box on screen, relative to the image view.</summary>
public sealed record DrawnOutline(int Hdu, string Name, double Left, double Top, double Right, double Bottom);
