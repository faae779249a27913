using System.ComponentModel;
using Microsoft.AspNetCore.Http.HttpResults;
using Mosaic.Imaging.Display;
using Mosaic.Server.Api;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Histograms;
using Mosaic.Server.Pyramids;
using Mosaic.Server.Regions;
using Mosaic.Server.Security;

namespace Mosaic.Server.Endpoints;

public static class StatisticsEndpoints
{
    private static readonly string[] Scales = ["linear", "log"];

    public static RouteGroupBuilder MapStatisticsEndpoints(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/fields").WithTags("Statistics");
        group.MapGet("/{field}/stats", Stats)
            .WithSummary("Statistics of a band: field-wide (all HDUs, from the histogram, exact: false) without a box; with x0, y0, x1, y1 those of the box's pixels (exact up to 16 Mpx, else from a reduced level).")
            .Expensive(HasBox);
        group.MapGet("/{field}/histogram", Histogram)
            .WithSummary("Counts of the band's finite pixels (all HDUs) in equal bins over [lo, hi], with the counts below, above and masked.")
            .Expensive();
        return group;
    }

    /// <summary>Field-wide statistics are read from the stored histogram: only a box costs pixels.</summary>
    private static bool HasBox(HttpRequest request) =>
        RegionQuery.HasBox(request.Query["x0"], request.Query["y0"], request.Query["x1"], request.Query["y1"]);

    private static Ok<StatsDto> Stats(
        string field,
        [Description("Band name (case-insensitive); the field's first band when absent.")] string? band,
        [Description("Chip: HDU index (the band's chip number where the band spans several files), EXTNAME or chip name, or canvas (the whole-field canvas) of the box; may be left out where every band has one image HDU (and does not matter without a box).")] string? hdu,
        [Description("Box: first column, FITS 1-based.")] string? x0,
        [Description("Box: first row, FITS 1-based.")] string? y0,
        [Description("Box: last column (inclusive).")] string? x1,
        [Description("Box: last row (inclusive).")] string? y1,
        FieldCatalog catalog, RegionStatisticsService statistics)
    {
        var target = catalog.Get(field).ResolveBand(band);
        if (!RegionQuery.HasBox(x0, y0, x1, y1))
        {
            // Field-wide statistics do not depend on the HDU, but a named one must still exist.
            if (!string.IsNullOrWhiteSpace(hdu)) target.ResolveHdu(hdu);
            return TypedResults.Ok(StatisticsMapper.ToDto(statistics.ForBand(target), target.Name, null, null, BandUnit(target)));
        }
        var image = RegionQuery.ResolveHdu(target, hdu);
        var box = RegionQuery.RequiredBox(image, x0, y0, x1, y1);
        return TypedResults.Ok(StatisticsMapper.ToDto(statistics.ForBox(image, box), target.Name, image.Index, box, image.Unit));
    }

    private static Ok<HistogramDto> Histogram(
        string field,
        [Description("Band name (case-insensitive); the field's first band when absent.")] string? band,
        [Description("Number of equal bins, 1 to 4096; 256 when absent.")] string? bins,
        [Description("Lower edge (physical value); the default display's lower limit when absent.")] string? lo,
        [Description("Upper edge (physical value, > lo); the default display's upper limit when absent.")] string? hi,
        [Description("Bin spacing: linear (equal in value, the default) or log (equal in log value; needs lo > 0).")] string? scale,
        FieldCatalog catalog, PyramidService pyramids)
    {
        var target = catalog.Get(field).ResolveBand(band);
        var count = QueryParameters.OptionalInteger("bins", bins) ?? 256;
        if (count < 1 || count > HistogramBinning.MaxBins)
            throw MosaicRequestException.BadParameter("bins", $"'bins' must be from 1 to {HistogramBinning.MaxBins}; got {count}.");
        var spacing = QueryParameters.OptionalChoice("scale", scale, Scales) == "log" ? BinScale.Log : BinScale.Linear;
        var low = QueryParameters.OptionalFinite("lo", lo);
        var high = QueryParameters.OptionalFinite("hi", hi);

        var summary = pyramids.GetBandSummary(target);
        if (low is null || high is null)
        {
            var limits = DisplaySettings.Default.Limits.Resolve(summary.Statistics, summary.Histogram);
            low ??= limits.Lo;
            high ??= limits.Hi;
        }
        if (!(low < high))
            throw MosaicRequestException.BadParameter(hi is null ? "lo" : "hi", $"'lo' ({low}) must be < 'hi' ({high}).");
        if (spacing == BinScale.Log && !(low > 0))
            throw MosaicRequestException.BadParameter("lo", $"A log-spaced histogram needs 'lo' > 0; got {low}.");
        var histogram = HistogramBinning.Bin(summary.Histogram, low.Value, high.Value, count, spacing);
        return TypedResults.Ok(StatisticsMapper.ToDto(histogram, target.Name, BandUnit(target)));
    }

    /// <summary>BUNIT of the band's first HDU that has one: the chips of a band share their unit.</summary>
    internal static string? BandUnit(FieldBand band) => band.Hdus.Select(h => h.Unit).FirstOrDefault(u => u is not null);
}
