using Mosaic.Server.Histograms;
using Mosaic.Server.Regions;

namespace Mosaic.Server.Api;

/// <summary>Statistics and histograms to the JSON the API documents.</summary>
public static class StatisticsMapper
{
    public static StatsDto ToDto(PixelStatistics statistics, string band, int? hdu, PixelBox? box, string? bunit)
    {
        var percentiles = new Dictionary<string, double?>(StringComparer.Ordinal);
        for (var i = 0; i < ReportedPercentiles.Values.Count; i++)
            percentiles[ReportedPercentiles.Key(ReportedPercentiles.Values[i])] = Finite(statistics.Percentiles[i]);
        return new StatsDto(band, hdu, box is { } b ? new BoxDto(b.X0, b.Y0, b.X1, b.Y1) : null,
            statistics.Count, statistics.Masked, Finite(statistics.Min), Finite(statistics.Max), Finite(statistics.Mean),
            Finite(statistics.Median), Finite(statistics.MadSigma), percentiles, bunit, statistics.Exact, statistics.Level);
    }

    public static HistogramDto ToDto(BinnedHistogram histogram, string band, string? bunit) =>
        new(band, histogram.Lo, histogram.Hi, histogram.Counts.Length, histogram.Scale.ToString().ToLowerInvariant(),
            histogram.Edges, histogram.Counts, histogram.Below, histogram.Above, histogram.Masked, bunit);

    private static double? Finite(double value) => double.IsFinite(value) ? value : null;
}
