using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.Net.Http.Headers;
using Mosaic.Imaging.Display;
using Mosaic.Server.Fields;
using Mosaic.Server.Tiles;

namespace Mosaic.Server.Endpoints;

public static class TileEndpoints
{
    public static RouteGroupBuilder MapTileEndpoints(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/tiles").WithTags("Tiles");
        group.MapGet("/{field}/{z:int}/{x:int}/{y:int}.png", GetTile)
            .WithSummary("A 256 x 256 PNG tile: zoom 0 holds the whole HDU, the deepest zoom one image pixel per tile pixel; y counts down from the top (highest FITS y). Masked and outside pixels are transparent. 503 with Retry-After while the pyramid is built.")
            .Produces(StatusCodes.Status200OK, contentType: "image/png");
        return group;
    }

    private static async Task<Results<FileContentHttpResult, StatusCodeHttpResult>> GetTile(
        string field, int z, int x, int y, string? band, string? hdu, string? v,
        HttpContext context, FieldCatalog catalog, TileService tiles)
    {
        var target = catalog.Get(field).ResolveBand(band).ResolveHdu(hdu);
        var tile = await tiles.GetTileAsync(target, z, x, y, DisplaySettings.Default);

        var headers = context.Response.Headers;
        headers.ETag = tile.ETag;
        // A URL that names the band's version can never show other pixels: cache it for good. Without it, revalidate.
        headers.CacheControl = v == target.Band.Version ? "public, max-age=31536000, immutable" : "no-cache";
        if (context.Request.Headers.IfNoneMatch.Any(tag => tag == tile.ETag))
            return TypedResults.StatusCode(StatusCodes.Status304NotModified);
        return TypedResults.File(tile.Png, "image/png");
    }
}
