using System.ComponentModel;
using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.Net.Http.Headers;
using Mosaic.Server.Composite;
using Mosaic.Server.Fields;
using Mosaic.Server.Tiles;

namespace Mosaic.Server.Endpoints;

public static class TileEndpoints
{
    public static RouteGroupBuilder MapTileEndpoints(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/tiles").WithTags("Tiles");
        group.MapGet("/{field}/{z:int}/{x:int}/{y:int}.png", GetTile)
            .WithSummary("A 256 x 256 PNG tile: zoom 0 holds the whole HDU, the deepest zoom one image pixel per tile pixel; y counts down from the top (highest FITS y). Display settings come from the query (see its parameters); masked and outside pixels are transparent unless 'masked' names a colour. 503 with Retry-After while the pyramid is built.")
            .Produces(StatusCodes.Status200OK, contentType: "image/png");
        return group;
    }

    private static async Task<Results<FileContentHttpResult, StatusCodeHttpResult>> GetTile(
        string field, int z, int x, int y,
        [Description("Band name (case-insensitive); the field's first band when absent.")] string? band,
        [Description("Chip: HDU index (the band's chip number where the band spans several files), EXTNAME or chip name, or canvas (the whole-field canvas); the band's first image HDU when absent.")] string? hdu,
        [Description("The band's version (from /api/fields): a URL carrying it is cached for good. With rgb: the red, green and blue bands' versions joined by '.'.")] string? v,
        [AsParameters] DisplayParameters display,
        [AsParameters] CompositeParameters composite,
        HttpContext context, FieldCatalog catalog, TileService tiles)
    {
        RenderedTile tile;
        string version;
        if (CompositeQuery.Parse(composite, display, context.Request.Query) is { } request)
        {
            var colour = CompositeTarget.Resolve(catalog.Get(field), request.Bands, hdu);
            tile = await tiles.GetCompositeTileAsync(colour, z, x, y, request.Settings);
            version = string.Join('.', colour.Bands.AsEnumerable().Select(b => b.Version));
        }
        else
        {
            var target = catalog.Get(field).ResolveBand(band).ResolveHdu(hdu);
            tile = await tiles.GetTileAsync(target, z, x, y, DisplayQuery.Parse(display));
            version = target.Band.Version;
        }

        var headers = context.Response.Headers;
        headers.ETag = tile.ETag;
        // A URL that names the band's version can never show other pixels: cache it for good. Without it, revalidate.
        headers.CacheControl = v == version ? "public, max-age=31536000, immutable" : "no-cache";
        if (context.Request.Headers.IfNoneMatch.Any(tag => tag == tile.ETag))
            return TypedResults.StatusCode(StatusCodes.Status304NotModified);
        return TypedResults.File(tile.Png, "image/png");
    }
}
