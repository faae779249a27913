namespace Mosaic.Browser.Tests.Viewer;

/// <summary>
/// What the pixel readout shows: the HDU name, the x and y texts, the value text, its kind ("value", "masked",
/// "outside", "error") and the raw number behind the value text.
/// </summary>
public sealed record Readout(string Hdu, string X, string Y, string ValueText, string Kind, double? RawValue);
