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
            .WithSummary("The pixel at FITS position (x, y) of an HDU, or at a sky position (ra and dec in ICRS degrees, or typed text in 'position', which finds the HDU): its 1-based coordinates, physical value (null where masked) and sky coordinates. With hdu=canvas the point is on the band's whole-field canvas, and the answer names the original chip, its pixel and value (null in a gap), with 'canvas' the canvas position.");
        return group;
    }

    private static Ok<List<FieldDto>> List(FieldCatalog catalog, PyramidService pyramids) =>
        TypedResults.Ok(catalog.Fields.Select(f => FieldMapper.ToDto(f, pyramids)).ToList());

    private static Ok<FieldDto> Get(string field, FieldCatalog catalog, PyramidService pyramids) =>
        TypedResults.Ok(FieldMapper.ToDto(catalog.Get(field), pyramids));

    /// <param name="x">FITS x (1-based; pixel i covers [i - 0.5, i + 0.5)).</param>
    /// <param name="y">FITS y (1-based).</param>
    /// <param name="ra">ICRS right ascension in decimal degrees (with dec, instead of x and y).</param>
    /// <param name="dec">ICRS declination in decimal degrees.</param>
    /// <param name="position">A sky position as typed: "12:34:56.7 -01:02:03", "12h34m56.7s -1d02m03s" or "188.736 -1.034".</param>
    private static Ok<ProbeDto> Probe(string field, string? band, string? hdu, string? x, string? y, string? ra, string? dec,
        string? position, FieldCatalog catalog)
    {
        var resolved = catalog.Get(field).ResolveBand(band);
        if (CanvasProbe.IsCanvas(hdu)) return TypedResults.Ok(CanvasProbe.Probe(resolved, ProbeQuery.Parse(x, y, ra, dec, position)));
        var (target, atX, atY) = ProbeTarget.Resolve(resolved, hdu, ProbeQuery.Parse(x, y, ra, dec, position));
        var px = ContainingPixel("x", atX, target.Plane.Width);
        var py = ContainingPixel("y", atY, target.Plane.Height);
        return TypedResults.Ok(ProbeMapper.ToDto(target, atX, atY, px, py, target.Plane.ReadValue(px - 1, py - 1)));
    }

    private static int ContainingPixel(string name, double coordinate, int size)
    {
        var pixel = Math.Floor(coordinate + 0.5);
        if (pixel < 1 || pixel > size)
            throw MosaicRequestException.BadParameter(name, $"'{name}' = {coordinate} is outside the image, whose pixels run from 1 to {size} (edges at 0.5 and {size + 0.5}).");
        return (int)pixel;
    }
}
