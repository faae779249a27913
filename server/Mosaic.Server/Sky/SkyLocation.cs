using Mosaic.Server.Fields;

namespace Mosaic.Server.Sky;

/// <summary>Where a sky position falls: an HDU and its exact 1-based pixel position, or (Hdu null) why it falls on none.</summary>
public sealed record SkyLocation(FieldHdu? Hdu, double X, double Y, string? Miss);
