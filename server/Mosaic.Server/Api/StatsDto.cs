namespace Mosaic.Server.Api;

/// <summary>
/// Statistics of a band (Hdu and Box null: field-wide, from its histogram) or of a box of one HDU. Values are
/// physical, null where no pixel is finite. Exact: computed from every native pixel of the box; Level: the zoom
/// level read instead for a box too large to sort.
/// </summary>
public sealed record StatsDto(
    string Band,
    int? Hdu,
    BoxDto? Box,
    long Count,
    long Masked,
    double? Min,
    double? Max,
    double? Mean,
    double? Median,
    double? MadSigma,
    IReadOnlyDictionary<string, double?> Percentiles,
    string? Bunit,
    bool Exact,
    int? Level);
