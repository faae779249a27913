using System.ComponentModel;
using Microsoft.AspNetCore.Http.HttpResults;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Server.Api;
using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;

namespace Mosaic.Server.Endpoints;

public static class DisplayEndpoints
{
    public static IEndpointRouteBuilder MapDisplayEndpoints(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/api/fields/{field}/display", Display).WithTags("Display")
            .WithSummary("The display the query parameters describe, resolved for a band: canonical key, lo/hi, the stretch's and palette's resolved parameters, and the colour bar (256 physical values and colours).");
        routes.MapGet("/api/palettes", Palettes).WithTags("Display")
            .WithSummary("Every palette with its label, 256 colours (cubehelix with its default parameters) and parameters.");
        return routes;
    }

    private static Ok<DisplayDto> Display(
        string field,
        [Description("Band name (case-insensitive); the field's first band when absent.")] string? band,
        [AsParameters] DisplayParameters display,
        FieldCatalog catalog, PyramidService pyramids)
    {
        var target = catalog.Get(field).ResolveBand(band);
        var settings = DisplayQuery.Parse(display);
        var summary = pyramids.GetBandSummary(target);
        var resolved = settings.Resolve(summary.Statistics, summary.Histogram);
        return TypedResults.Ok(DisplayMapper.ToDto(resolved, target.Name, StatisticsEndpoints.BandUnit(target)));
    }

    private static Ok<List<PaletteDto>> Palettes() =>
        TypedResults.Ok(PaletteCatalog.Names.Select(name => DisplayMapper.ToDto(PaletteCatalog.Create(name))).ToList());
}
