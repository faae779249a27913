using Microsoft.AspNetCore.Http.HttpResults;
using Mosaic.Server.Api;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;

namespace Mosaic.Server.Endpoints;

public static class FieldEndpoints
{
    public static RouteGroupBuilder MapFieldEndpoints(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/fields").WithTags("Fields");
        group.MapGet("/", List)
            .WithSummary("Every field of the data folder, with its bands, HDUs and pyramid progress; unreadable files carry 'error'.");
        group.MapGet("/{field}", Get)
            .WithSummary("One field (poll it for pyramid progress).");
        group.MapGet("/{field}/probe", Probe)
            .WithSummary("The pixel containing FITS position (x, y) of an HDU: its 1-based coordinates and physical value (null where masked).");
        return group;
    }

    private static Ok<List<FieldDto>> List(FieldCatalog catalog, PyramidService pyramids) =>
        TypedResults.Ok(catalog.Fields.Select(f => FieldMapper.ToDto(f, pyramids)).ToList());

    private static Ok<FieldDto> Get(string field, FieldCatalog catalog, PyramidService pyramids) =>
        TypedResults.Ok(FieldMapper.ToDto(catalog.Get(field), pyramids));

    /// <param name="x">FITS x (1-based; pixel i covers [i - 0.5, i + 0.5)).</param>
    /// <param name="y">FITS y (1-based).</param>
    private static Ok<ProbeDto> Probe(string field, string? band, string? hdu, string? x, string? y, FieldCatalog catalog)
    {
        var target = catalog.Get(field).ResolveBand(band).ResolveHdu(hdu);
        var px = ContainingPixel("x", QueryParameters.RequiredFinite("x", x), target.Plane.Width);
        var py = ContainingPixel("y", QueryParameters.RequiredFinite("y", y), target.Plane.Height);
        var value = target.Plane.ReadValue(px - 1, py - 1);
        return TypedResults.Ok(new ProbeDto(target.Band.Field.Id, target.Band.Name, target.Index, target.Name, px, py,
            double.IsNaN(value) ? null : value, target.Unit));
    }

    private static int ContainingPixel(string name, double coordinate, int size)
    {
        var pixel = Math.Floor(coordinate + 0.5);
        if (pixel < 1 || pixel > size)
            throw MosaicRequestException.BadParameter(name, $"'{name}' = {coordinate} is outside the image, whose pixels run from 1 to {size} (edges at 0.5 and {size + 0.5}).");
        return (int)pixel;
    }
}
