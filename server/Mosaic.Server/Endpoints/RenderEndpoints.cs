using System.ComponentModel;
using System.Text;
using Mosaic.Server.Composite;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Rendering;
using Mosaic.Server.Security;
using Mosaic.TileCache.Throttling;

namespace Mosaic.Server.Endpoints;

public static class RenderEndpoints
{
    public static RouteGroupBuilder MapRenderEndpoints(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/fields").WithTags("Render");
        group.MapGet("/{field}/render.png", Render)
            .WithSummary("A PNG of the box [x0, x1] x [y0, y1] (FITS 1-based, inclusive) of one HDU at native resolution, row y1 at the top, with the display the query describes (at most 50 megapixels). Gray palette: 8-bit grayscale (gray + alpha with masked=transparent and masked pixels, RGB with a masked colour); other palettes: indexed.")
            .Produces(StatusCodes.Status200OK, contentType: "image/png")
            .Expensive();
        return group;
    }

    private static async Task<PngResponse> Render(
        string field,
        [Description("Band name (case-insensitive); the field's first band when absent.")] string? band,
        [Description("Chip: HDU index (the band's chip number where the band spans several files), EXTNAME or chip name, or canvas (the whole-field canvas); may be left out where every band has one image HDU.")] string? hdu,
        [Description("First column, FITS 1-based.")] string? x0,
        [Description("First row, FITS 1-based (the bottom row of the image).")] string? y0,
        [Description("Last column (inclusive).")] string? x1,
        [Description("Last row (inclusive), drawn at the top.")] string? y1,
        [AsParameters] DisplayParameters display,
        [AsParameters] CompositeParameters composite,
        HttpContext context, FieldCatalog catalog, RegionImageService images, RenderQueue queue)
    {
        if (CompositeQuery.Parse(composite, display, context.Request.Query) is { } request)
            return await RenderComposite(field, hdu, x0, y0, x1, y1, request, context, catalog, images, queue);
        var target = catalog.Get(field).ResolveBand(band);
        var image = RegionQuery.ResolveHdu(target, hdu);
        var box = RegionQuery.RequiredBox(image, x0, y0, x1, y1);
        if (box.PixelCount > RegionImageService.MaxPixels)
            throw MosaicRequestException.BadParameter("x0,y0,x1,y1",
                $"The box is {box.Width} x {box.Height} = {box.PixelCount} pixels; render.png makes at most {RegionImageService.MaxPixels} (50 megapixels): ask for a smaller box.");
        var settings = DisplayQuery.Parse(display, paletteMaskByDefault: true);
        // Shares the tiles' render queue, so a large image takes a core from tile rendering instead of one beside it.
        var png = await queue.RunAsync(() => images.RenderPng(image, box, settings, context.RequestAborted), context.RequestAborted);

        var name = $"{target.Field.Id}-{target.Name}-{image.Index}-{box.X0}-{box.Y0}-{box.X1}-{box.Y1}.png";
        context.Response.Headers.ContentDisposition = $"inline; filename=\"{SafeFileName(name)}\"";
        context.Response.Headers.CacheControl = "no-cache";
        return new PngResponse(png);
    }

    private static async Task<PngResponse> RenderComposite(string field, string? hdu, string? x0, string? y0, string? x1, string? y1,
        CompositeRequest request, HttpContext context, FieldCatalog catalog, RegionImageService images, RenderQueue queue)
    {
        var found = catalog.Get(field);
        if (string.IsNullOrWhiteSpace(hdu))
        {
            // As for one band: without 'hdu' the three bands must each hold one image.
            var bands = request.Bands.AsEnumerable().Select(name => found.Bands.FirstOrDefault(b => string.Equals(b.Name, name, StringComparison.OrdinalIgnoreCase)));
            if (bands.Any(b => b is not null && b.Hdus.Count > 1))
                throw MosaicRequestException.BadParameter("hdu", $"A band of the composite has several image HDUs: name one with 'hdu'.");
        }
        var target = CompositeTarget.Resolve(found, request.Bands, hdu);
        var image = target.Hdus.Red;
        var box = RegionQuery.RequiredBox(image, x0, y0, x1, y1);
        if (box.PixelCount > RegionImageService.MaxPixels)
            throw MosaicRequestException.BadParameter("x0,y0,x1,y1",
                $"The box is {box.Width} x {box.Height} = {box.PixelCount} pixels; render.png makes at most {RegionImageService.MaxPixels} (50 megapixels): ask for a smaller box.");
        var png = await queue.RunAsync(() => images.RenderCompositePng(target, box, request.Settings, context.RequestAborted), context.RequestAborted);
        var bandNames = string.Join('-', target.Bands.AsEnumerable().Select(b => b.Name));
        var name = $"{found.Id}-{bandNames}-{image.Index}-{box.X0}-{box.Y0}-{box.X1}-{box.Y1}.png";
        context.Response.Headers.ContentDisposition = $"inline; filename=\"{SafeFileName(name)}\"";
        context.Response.Headers.CacheControl = "no-cache";
        return new PngResponse(png);
    }

    /// <summary>Field and band names come from file names: keep the header a plain quoted ASCII string.</summary>
    private static string SafeFileName(string name)
    {
        var text = new StringBuilder(name.Length);
        foreach (var c in name) text.Append(char.IsAsciiLetterOrDigit(c) || c is '-' or '_' or '.' ? c : '_');
        return text.ToString();
    }
}
