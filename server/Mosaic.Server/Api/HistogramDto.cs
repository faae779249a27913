namespace Mosaic.Server.Api;

/// <summary>Counts of a band's finite pixels (all HDUs) in Bins bins between Edges; Below/Above: outside [Lo, Hi].</summary>
public sealed record HistogramDto(
    string Band,
    double Lo,
    double Hi,
    int Bins,
    string Scale,
    IReadOnlyList<double> Edges,
    IReadOnlyList<long> Counts,
    long Below,
    long Above,
    long Masked,
    string? Bunit);
