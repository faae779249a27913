using Microsoft.AspNetCore.Http.HttpResults;
using Mosaic.Server.Api;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Sky;

namespace Mosaic.Server.Endpoints;

public static class SkyEndpoints
{
    public static RouteGroupBuilder MapSkyEndpoints(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/fields").WithTags("Sky");
        group.MapGet("/{field}/sky", Sky)
            .WithSummary("For the visible box [x0, x1] x [y0, y1] (FITS 1-based) drawn on a width x height screen area: the centre's sky position, north and east, the pixel scale, and an RA/Dec grid.");
        return group;
    }

    private static Ok<SkyDto> Sky(string field, string? band, string? hdu, string? x0, string? y0, string? x1, string? y1,
        string? width, string? height, FieldCatalog catalog)
    {
        var target = catalog.Get(field).ResolveBand(band).ResolveHdu(hdu);
        var box = ViewBoxQuery.Required(target, x0, y0, x1, y1, width, height);
        var wcs = target.Sky.Wcs
            ?? throw new SkyUnavailableException($"HDU {target.Name} of band '{target.Band.Name}' has no sky coordinates: {target.Sky.Error}.", target.Sky.Error, "hdu");
        return TypedResults.Ok(SkyMapper.ToDto(SkyView.Compute(wcs, box, target.Sky.PixelScaleArcsec)));
    }
}
