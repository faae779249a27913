using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Regions;

namespace Mosaic.Server.Endpoints;

/// <summary>The HDU and pixel box a region request names, checked against the image, with errors naming the parameter.</summary>
public static class RegionQuery
{
    /// <summary>
    /// The HDU named by <paramref name="hdu"/>; without one, the field's single image grid, which exists where every
    /// band has exactly one image HDU (the bands then share one pixel grid).
    /// </summary>
    public static FieldHdu ResolveHdu(FieldBand band, string? hdu)
    {
        if (!string.IsNullOrWhiteSpace(hdu)) return band.ResolveHdu(hdu);
        if (band.Field.Bands.All(b => b.Error is not null || b.Hdus.Count == 1) && band.Hdus.Count == 1) return band.Hdus[0];
        throw MosaicRequestException.BadParameter("hdu",
            $"Band '{band.Name}' of field '{band.Field.Id}' has {band.Hdus.Count} image HDUs ({string.Join(", ", band.Hdus.Select(h => h.Name))}) or shares the field with bands that do: name one with 'hdu'.");
    }

    /// <summary>All four of x0, y0, x1, y1 (FITS 1-based, inclusive), inside the HDU's image.</summary>
    public static PixelBox RequiredBox(FieldHdu hdu, string? x0, string? y0, string? x1, string? y1)
    {
        int left = QueryParameters.RequiredInteger("x0", x0), bottom = QueryParameters.RequiredInteger("y0", y0);
        int right = QueryParameters.RequiredInteger("x1", x1), top = QueryParameters.RequiredInteger("y1", y1);
        int width = hdu.Plane.Width, height = hdu.Plane.Height;
        Inside("x0", left, width);
        Inside("y0", bottom, height);
        Inside("x1", right, width);
        Inside("y1", top, height);
        if (right < left) throw MosaicRequestException.BadParameter("x1", $"'x1' ({right}) must be ≥ 'x0' ({left}).");
        if (top < bottom) throw MosaicRequestException.BadParameter("y1", $"'y1' ({top}) must be ≥ 'y0' ({bottom}).");
        return new PixelBox(left, bottom, right, top);
    }

    /// <summary>True where any of the four box parameters is given (then all four are required).</summary>
    public static bool HasBox(string? x0, string? y0, string? x1, string? y1) =>
        !new[] { x0, y0, x1, y1 }.All(string.IsNullOrWhiteSpace);

    private static void Inside(string name, int value, int size)
    {
        if (value < 1 || value > size)
            throw MosaicRequestException.BadParameter(name, $"'{name}' = {value} is outside the image, whose pixels run from 1 to {size}.");
    }
}
