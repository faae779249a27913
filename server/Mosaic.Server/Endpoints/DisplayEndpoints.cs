using System.ComponentModel;
using Microsoft.AspNetCore.Http.HttpResults;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Server.Api;
using Mosaic.Server.Composite;
using Mosaic.Server.Fields;
using Mosaic.Server.Tiles;
using Mosaic.Server.Pyramids;

namespace Mosaic.Server.Endpoints;

public static class DisplayEndpoints
{
    public static IEndpointRouteBuilder MapDisplayEndpoints(this IEndpointRouteBuilder routes)
    {
        routes.MapGet("/api/fields/{field}/display", Display).WithTags("Display")
            .WithSummary("The display the query parameters describe, resolved for a band: canonical key, lo/hi, the stretch's and palette's resolved parameters, and the colour bar (256 physical values and colours). With rgb: the composite resolved for its three bands (the Lupton q, range and minima, or each channel's display) and the weights.");
        routes.MapGet("/api/palettes", Palettes).WithTags("Display")
            .WithSummary("Every palette with its label, 256 colours (cubehelix with its default parameters) and parameters.");
        return routes;
    }

    private static Results<Ok<DisplayDto>, Ok<CompositeDisplayDto>> Display(
        string field,
        [Description("Band name (case-insensitive); the field's first band when absent.")] string? band,
        [Description("With rgb: the HDU (index or EXTNAME) whose grids the three bands must share; each band's first image HDU when absent.")] string? hdu,
        [AsParameters] DisplayParameters display,
        [AsParameters] CompositeParameters composite,
        HttpContext context, FieldCatalog catalog, PyramidService pyramids, DisplayCompiler displays)
    {
        if (CompositeQuery.Parse(composite, display, context.Request.Query) is { } request)
        {
            var colour = CompositeTarget.Resolve(catalog.Get(field), request.Bands, hdu);
            var resolvedComposite = request.Settings.Resolve(displays.ChannelBandsOf(colour.Bands));
            return TypedResults.Ok(CompositeMapper.ToDto(resolvedComposite, colour));
        }
        var target = catalog.Get(field).ResolveBand(band);
        var settings = DisplayQuery.Parse(display);
        var summary = pyramids.GetBandSummary(target);
        var resolved = settings.Resolve(summary.Statistics, summary.Histogram);
        return TypedResults.Ok(DisplayMapper.ToDto(resolved, target.Name, StatisticsEndpoints.BandUnit(target)));
    }

    private static Ok<List<PaletteDto>> Palettes() =>
        TypedResults.Ok(PaletteCatalog.Names.Select(name => DisplayMapper.ToDto(PaletteCatalog.Create(name))).ToList());
}
