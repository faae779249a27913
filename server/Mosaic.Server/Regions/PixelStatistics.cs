namespace Mosaic.Server.Regions;

/// <summary>
/// Statistics of a set of pixels: finite count, masked count, and values (NaN where no pixel is finite).
/// Percentiles line up with <see cref="ReportedPercentiles.Values"/>. Exact when computed from every pixel of the
/// set; otherwise from a histogram or a reduced level (<see cref="Level"/>).
/// </summary>
public sealed record PixelStatistics(
    long Count,
    long Masked,
    double Min,
    double Max,
    double Mean,
    double Median,
    double MadSigma,
    IReadOnlyList<double> Percentiles,
    bool Exact,
    int? Level);
