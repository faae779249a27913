namespace Mosaic.Server.Api;

/// <summary>The centre of a view (1-based FITS pixel) and its ICRS position; the sky fields are null where it has none.</summary>
public sealed record SkyCentreDto(double X, double Y, double? Ra, double? Dec, string? RaSexagesimal, string? DecSexagesimal);
