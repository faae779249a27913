namespace Mosaic.Browser.Tests.Viewer;

/// <summary>
/// The sky part of the pixel readout as shown: its kind ("sky", "no-wcs", "no-position"), the RA and Dec texts
/// (sexagesimal and decimal degrees), Galactic l and b, the exact position the server probed (atX, atY) and the
/// "no WCS" tooltip.
/// </summary>
public sealed record SkyReadout(string Kind, string Ra, string RaDegrees, string Dec, string DecDegrees, string L, string B,
    double? AtX, double? AtY, string NoWcsReason);
