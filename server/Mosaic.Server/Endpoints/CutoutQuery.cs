using System.Globalization;
using Mosaic.Server.Cutouts;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Regions;

namespace Mosaic.Server.Endpoints;

/// <summary>
/// What a cutout asks for: a pixel box (x0, y0, x1, y1, FITS 1-based inclusive, inside the image: as for stats), or a
/// sky position (ra and dec, or position) and a size in arcseconds, whose box is centred on the position's pixel and
/// cut at the image edge. Errors name the parameter.
/// </summary>
public static class CutoutQuery
{
    /// <exception cref="MosaicRequestException">400 for a bad or missing parameter, 404 for a position on no chip, 413 for a box over the limit.</exception>
    public static CutoutRequest Resolve(FieldBand band, string? hdu, string? x0, string? y0, string? x1, string? y1,
        string? ra, string? dec, string? position, string? size, long pixelLimit)
    {
        ArgumentNullException.ThrowIfNull(band);
        var hasBox = RegionQuery.HasBox(x0, y0, x1, y1);
        var sky = Given(ra) ? "ra" : Given(dec) ? "dec" : Given(position) ? "position" : null;
        if (hasBox && sky is not null)
            throw MosaicRequestException.BadParameter(sky, $"Give a pixel box (x0, y0, x1, y1) or a sky position and size, not both: '{sky}' was given with the box.");
        if (hasBox)
        {
            if (Given(size)) throw MosaicRequestException.BadParameter("size", "'size' goes with a sky position (ra and dec, or position); a pixel box has its own size.");
            var image = RegionQuery.ResolveHdu(band, hdu);
            var box = RegionQuery.RequiredBox(image, x0, y0, x1, y1);
            CheckLimit(box.Width, box.Height, pixelLimit, "x0,y0,x1,y1");
            return new CutoutRequest(image, box);
        }
        if (sky is null)
            throw MosaicRequestException.BadParameter("x0",
                "A cutout needs a pixel box (x0, y0, x1, y1, FITS 1-based inclusive) or a sky position (ra and dec in degrees, or position) with a size in arcseconds.");
        return FromSky(band, hdu, ra, dec, position, size, pixelLimit);
    }

    private static CutoutRequest FromSky(FieldBand band, string? hdu, string? ra, string? dec, string? position, string? size, long pixelLimit)
    {
        var (widthArcsec, heightArcsec) = Size(size);
        var query = ProbeQuery.Parse(null, null, ra, dec, position);
        // On the canvas, as without 'hdu', the chip that holds the position is cut: its pixels are the originals.
        var named = CanvasProbe.IsCanvas(hdu) ? null : hdu;
        var (chip, x, y) = ProbeTarget.Resolve(band, named, query);
        var wcs = chip.Sky.Wcs!;
        var scaleX = SeparationArcsec(wcs, x - 0.5, y, x + 0.5, y);
        var scaleY = SeparationArcsec(wcs, x, y - 0.5, x, y + 0.5);
        if (!(scaleX > 0) || !(scaleY > 0))
            throw new SkyUnavailableException($"The pixel scale of {chip.Name} at the position cannot be found from its WCS.", null, query.SkyParameter);
        double width = Math.Max(1, Math.Round(widthArcsec / scaleX)), height = Math.Max(1, Math.Round(heightArcsec / scaleY));
        CheckLimit(width, height, pixelLimit, "size");

        // The w pixels whose outer edges lie nearest x -/+ w/2: centred on the position to half a pixel.
        var left = (long)Math.Floor(x - width / 2 + 1);
        var bottom = (long)Math.Floor(y - height / 2 + 1);
        long right = left + (long)width - 1, top = bottom + (long)height - 1;
        int planeWidth = chip.Plane.Width, planeHeight = chip.Plane.Height;
        var clipped = left < 1 || bottom < 1 || right > planeWidth || top > planeHeight;
        var box = new PixelBox((int)Math.Max(1, left), (int)Math.Max(1, bottom), (int)Math.Min(planeWidth, right), (int)Math.Min(planeHeight, top));
        return new CutoutRequest(chip, box, query.Sky, (widthArcsec, heightArcsec), clipped);
    }

    /// <summary>One size in arcseconds for a square, or "w,h".</summary>
    private static (double Width, double Height) Size(string? text)
    {
        if (!Given(text)) throw MosaicRequestException.BadParameter("size", "'size' is required with a sky position: the cutout's size in arcseconds, one value or \"width,height\".");
        var parts = text!.Split(',');
        if (parts.Length > 2) throw MosaicRequestException.BadParameter("size", $"'size' is one value or two (\"width,height\") in arcseconds; got '{text}'.");
        var values = new double[parts.Length];
        for (var i = 0; i < parts.Length; i++)
        {
            if (!double.TryParse(parts[i].Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out values[i]) || !double.IsFinite(values[i]) || values[i] <= 0)
                throw MosaicRequestException.BadParameter("size", $"'size' must be one or two positive numbers of arcseconds; got '{text}'.");
        }
        return (values[0], values[^1]);
    }

    private static void CheckLimit(double width, double height, long limit, string parameter)
    {
        if (width * height <= limit) return;
        throw new MosaicRequestException(StatusCodes.Status413RequestEntityTooLarge, "Cutout too large",
            $"The cutout would be {width:0} x {height:0} = {width * height:0} pixels; at most {limit} are cut at once: ask for a smaller box.", parameter);
    }

    /// <summary>Great-circle distance of two pixels' sky positions (haversine, stable for small angles; common practice).</summary>
    private static double SeparationArcsec(Mosaic.Wcs.Wcs wcs, double xa, double ya, double xb, double yb)
    {
        if (!wcs.TryPixelToSky(xa, ya, out var ra1, out var dec1) || !wcs.TryPixelToSky(xb, yb, out var ra2, out var dec2)) return double.NaN;
        double d1 = double.DegreesToRadians(dec1), d2 = double.DegreesToRadians(dec2);
        double dd = d2 - d1, dr = double.DegreesToRadians(ra2 - ra1);
        var h = Math.Sin(dd / 2) * Math.Sin(dd / 2) + Math.Cos(d1) * Math.Cos(d2) * Math.Sin(dr / 2) * Math.Sin(dr / 2);
        return double.RadiansToDegrees(2 * Math.Asin(Math.Min(1, Math.Sqrt(h)))) * 3600;
    }

    private static bool Given(string? text) => !string.IsNullOrWhiteSpace(text);
}
