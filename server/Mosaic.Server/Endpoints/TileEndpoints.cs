using System.ComponentModel;
using Microsoft.AspNetCore.Http.HttpResults;
using Microsoft.Net.Http.Headers;
using Mosaic.Server.Composite;
using Mosaic.Server.Fields;
using Mosaic.Server.Tiles;
using Mosaic.TileCache;

namespace Mosaic.Server.Endpoints;

public static class TileEndpoints
{
    public static RouteGroupBuilder MapTileEndpoints(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/tiles").WithTags("Tiles");
        group.MapGet("/{field}/{z:int}/{x:int}/{y:int}.png", GetTile)
            .WithSummary("A 256 x 256 PNG tile: zoom 0 holds the whole HDU, the deepest zoom one image pixel per tile pixel; y counts down from the top (highest FITS y). Display settings come from the query (see its parameters); masked and outside pixels are transparent unless 'masked' names a colour. 503 with Retry-After while the pyramid is built, 429 with Retry-After when the server has more tiles to render than its queue holds.")
            .Produces(StatusCodes.Status200OK, contentType: "image/png");
        return group;
    }

    /// <summary>Which tier answered (memory, disk, shared or rendered): lets an operator see the cache working.</summary>
    public const string TileSourceHeader = "X-Tile-Cache";

    private static string SourceName(TileSource source) => source switch
    {
        TileSource.Memory => "memory",
        TileSource.Disk => "disk",
        TileSource.Shared => "shared",
        _ => "rendered",
    };

    private static async Task<Results<FileContentHttpResult, StatusCodeHttpResult>> GetTile(
        string field, int z, int x, int y,
        [Description("Band name (case-insensitive); the field's first band when absent.")] string? band,
        [Description("Chip: HDU index (the band's chip number where the band spans several files), EXTNAME or chip name, or canvas (the whole-field canvas); the band's first image HDU when absent.")] string? hdu,
        [Description("The band's version (from /api/fields): a URL carrying it is cached for good. With rgb: the red, green and blue bands' versions joined by '.'.")] string? v,
        [AsParameters] DisplayParameters display,
        [AsParameters] CompositeParameters composite,
        HttpContext context, FieldCatalog catalog, TileService tiles)
    {
        PreparedTile prepared;
        string version;
        if (CompositeQuery.Parse(composite, display, context.Request.Query) is { } request)
        {
            var colour = CompositeTarget.Resolve(catalog.Get(field), request.Bands, hdu);
            prepared = tiles.PrepareComposite(colour, z, x, y, request.Settings);
            version = string.Join('.', colour.Bands.AsEnumerable().Select(b => b.Version));
        }
        else
        {
            var target = catalog.Get(field).ResolveBand(band).ResolveHdu(hdu);
            prepared = tiles.Prepare(target, z, x, y, DisplayQuery.Parse(display));
            version = target.Band.Version;
        }

        // A URL that names the band's version can never show other pixels: cache it for good. Without it, revalidate.
        var cacheControl = v == version ? "public, max-age=31536000, immutable" : "no-cache";
        var headers = context.Response.Headers;
        // The ETag is the key's hash, so a client holding the tile is answered without looking it up or rendering it;
        // a 304 carries the ETag and Cache-Control a 200 would (RFC 9110 section 15.4.5).
        if (EntityTagMatch.ClientHolds(context.Request.Headers.IfNoneMatch, prepared.ETag))
        {
            headers.ETag = prepared.ETag;
            headers.CacheControl = cacheControl;
            return TypedResults.StatusCode(StatusCodes.Status304NotModified);
        }

        // Headers only once the tile is in hand: an error (404, 429, 503) must not leave a long-lived Cache-Control behind.
        var tile = await tiles.GetAsync(prepared, context.RequestAborted);
        headers.ETag = tile.ETag;
        headers.CacheControl = cacheControl;
        headers[TileSourceHeader] = SourceName(tile.Source);
        return TypedResults.File(tile.Png, "image/png");
    }
}
