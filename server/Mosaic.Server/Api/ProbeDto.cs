using System.Text.Json.Serialization;

namespace Mosaic.Server.Api;

/// <summary>
/// The pixel that contains a probed point. X and Y are FITS 1-based; Value is physical, null where masked. AtX and
/// AtY are the exact position probed; Ra/Dec (ICRS) and L/B (Galactic) are its sky position, null without a WCS.
/// On the canvas (hdu=canvas) Hdu, HduName, X, Y, Value, Bunit, AtX and AtY are the original chip's, and Canvas
/// the canvas position; in a gap between chips they are null. Canvas is left out of other probes. File is the file
/// holding the chip (null in a gap), and FitsIndex its HDU number there where that differs from Hdu.
/// </summary>
public sealed record ProbeDto(string Field, string Band, int? Hdu, string? HduName, int? X, int? Y, double? Value, string? Bunit,
    double? AtX, double? AtY, double? Ra, double? Dec, string? RaSexagesimal, string? DecSexagesimal, double? L, double? B,
    [property: JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] CanvasPointDto? Canvas = null, string? File = null,
    [property: JsonIgnore(Condition = JsonIgnoreCondition.WhenWritingNull)] int? FitsIndex = null);
