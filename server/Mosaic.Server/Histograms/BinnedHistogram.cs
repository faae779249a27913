namespace Mosaic.Server.Histograms;

/// <summary>
/// Counts of finite pixels in the bins between Edges[i] and Edges[i + 1] (the last bin includes hi), with the
/// pixels below lo and above hi, and the masked ones.
/// </summary>
public sealed record BinnedHistogram(double Lo, double Hi, BinScale Scale, double[] Edges, long[] Counts, long Below, long Above, long Masked);
