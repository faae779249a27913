using Mosaic.Imaging.Statistics;

namespace Mosaic.Server.Pyramids;

/// <summary>A band's histogram and statistics over all of its HDUs: what field-wide display limits come from.</summary>
public sealed record BandSummary(ValueHistogram Histogram, BandStatistics Statistics);
