using System.Globalization;
using Mosaic.Server.Fields;
using Mosaic.Wcs.Coordinates;

namespace Mosaic.Server.Sky;

/// <summary>
/// Finds the image HDU that holds a sky position. A miss is explained in words: in a gap between chips when the
/// position lies among them (inside the convex hull of their outlines), off the field when it lies outside, with the
/// distance to the nearest chip.
/// </summary>
public static class SkyLocator
{
    // A pixel whose sky position lies farther than this from the one asked for is a projection folding back.
    private const double RoundTripDegrees = 1.0 / 3600;

    /// <param name="hdus">The candidates; those without a WCS are passed over.</param>
    /// <param name="scope">What the candidates are, for the explanation: "band 'r'" or "HDU CCD2 of band 'r'".</param>
    public static SkyLocation Locate(IReadOnlyList<FieldHdu> hdus, SkyPosition position, string scope)
    {
        ArgumentNullException.ThrowIfNull(hdus);
        ArgumentNullException.ThrowIfNull(position);
        FieldHdu? best = null;
        double bestX = double.NaN, bestY = double.NaN, bestDepth = double.NegativeInfinity;
        FieldHdu? nearest = null;
        var nearestArcsec = double.PositiveInfinity;
        var nearestPixels = double.NaN;
        foreach (var hdu in hdus)
        {
            if (hdu.Sky.Wcs is not { } wcs) continue;
            int w = hdu.Plane.Width, h = hdu.Plane.Height;
            if (wcs.TryIcrsToPixel(position, out var x, out var y) && wcs.TryPixelToIcrs(x, y, out var back)
                && Separation(back, position) <= RoundTripDegrees)
            {
                if (x >= 0.5 && x < w + 0.5 && y >= 0.5 && y < h + 0.5)
                {
                    // Where chips overlap, the one in which the position lies deepest wins.
                    var depth = Math.Min(Math.Min(x - 0.5, w + 0.5 - x), Math.Min(y - 0.5, h + 0.5 - y));
                    if (depth > bestDepth) (best, bestX, bestY, bestDepth) = (hdu, x, y, depth);
                    continue;
                }
                var dx = Math.Max(0, Math.Max(0.5 - x, x - (w + 0.5)));
                var dy = Math.Max(0, Math.Max(0.5 - y, y - (h + 0.5)));
                var pixels = Math.Sqrt(dx * dx + dy * dy);
                var arcsec = hdu.Sky.PixelScaleArcsec is { } scale ? pixels * scale : OutlineDistance(wcs, w, h, position);
                if (arcsec < nearestArcsec) (nearest, nearestArcsec, nearestPixels) = (hdu, arcsec, pixels);
            }
            else
            {
                var arcsec = OutlineDistance(wcs, w, h, position);
                if (arcsec < nearestArcsec) (nearest, nearestArcsec, nearestPixels) = (hdu, arcsec, double.NaN);
            }
        }
        if (best is not null) return new SkyLocation(best, bestX, bestY, null);

        var text = SexagesimalFormatter.Format(position);
        var distance = nearest is null ? "" : Distance(nearestArcsec, nearestPixels);
        var chips = hdus.Count(h => h.Sky.Wcs is not null);
        string miss;
        if (chips > 1 && AmongOutlines(hdus, position))
            miss = $"{text} falls in a gap between the chips of {scope}" + (nearest is null ? "." : $": the nearest, {nearest.Name}, is {distance} away.");
        else if (chips > 1)
            miss = $"{text} lies off the field of {scope}" + (nearest is null ? "." : $": the nearest chip, {nearest.Name}, is {distance} away.");
        else
            miss = $"{text} lies off the image of {scope}" + (nearest is null ? "." : $": its edge is {distance} away.");
        return new SkyLocation(null, double.NaN, double.NaN, miss);
    }

    /// <summary>Whether the position lies inside the convex hull of the chips' outlines: seen from it, their outline points leave no gap of half a turn.</summary>
    private static bool AmongOutlines(IReadOnlyList<FieldHdu> hdus, SkyPosition position)
    {
        var bearings = new List<double>();
        foreach (var hdu in hdus)
            if (hdu.Sky.Wcs is { } wcs)
                foreach (var p in Outline(wcs, hdu.Plane.Width, hdu.Plane.Height))
                    bearings.Add(Bearing(position, p));
        if (bearings.Count < 3) return false;
        bearings.Sort();
        var gap = bearings[0] + 2 * Math.PI - bearings[^1];
        for (var k = 1; k < bearings.Count; k++) gap = Math.Max(gap, bearings[k] - bearings[k - 1]);
        return gap < Math.PI;
    }

    /// <summary>Corners and edge midpoints of an image, on the sky.</summary>
    private static IEnumerable<SkyPosition> Outline(Mosaic.Wcs.Wcs wcs, int width, int height)
    {
        double x0 = 0.5, y0 = 0.5, x1 = width + 0.5, y1 = height + 0.5, xm = (x0 + x1) / 2, ym = (y0 + y1) / 2;
        foreach (var (x, y) in new[] { (x0, y0), (xm, y0), (x1, y0), (x1, ym), (x1, y1), (xm, y1), (x0, y1), (x0, ym) })
            if (wcs.TryPixelToIcrs(x, y, out var p)) yield return p;
    }

    private static double OutlineDistance(Mosaic.Wcs.Wcs wcs, int width, int height, SkyPosition position)
    {
        var best = double.PositiveInfinity;
        foreach (var p in Outline(wcs, width, height)) best = Math.Min(best, Separation(p, position) * 3600);
        return best;
    }

    /// <summary>Position angle (radians, from north through east) of <paramref name="to"/> as seen from <paramref name="from"/>.</summary>
    private static double Bearing(SkyPosition from, SkyPosition to)
    {
        double d1 = from.Declination * Math.PI / 180, d2 = to.Declination * Math.PI / 180;
        var da = (to.RightAscension - from.RightAscension) * Math.PI / 180;
        return Math.Atan2(Math.Sin(da) * Math.Cos(d2), Math.Cos(d1) * Math.Sin(d2) - Math.Sin(d1) * Math.Cos(d2) * Math.Cos(da));
    }

    /// <summary>Angular distance in degrees (the haversine form, exact for small angles).</summary>
    private static double Separation(SkyPosition a, SkyPosition b)
    {
        double d1 = a.Declination * Math.PI / 180, d2 = b.Declination * Math.PI / 180;
        var da = (b.RightAscension - a.RightAscension) * Math.PI / 180;
        var s = Math.Sin((d2 - d1) / 2);
        var t = Math.Sin(da / 2);
        var h = s * s + Math.Cos(d1) * Math.Cos(d2) * t * t;
        return 2 * Math.Asin(Math.Min(1, Math.Sqrt(h))) * 180 / Math.PI;
    }

    private static string Distance(double arcsec, double pixels)
    {
        var angle = arcsec < 60 ? string.Create(CultureInfo.InvariantCulture, $"{arcsec:0.0}″")
            : arcsec < 3600 ? string.Create(CultureInfo.InvariantCulture, $"{arcsec / 60:0.0}′")
            : string.Create(CultureInfo.InvariantCulture, $"{arcsec / 3600:0.00}°");
        return double.IsFinite(pixels) ? string.Create(CultureInfo.InvariantCulture, $"{angle} ({pixels:0} px)") : angle;
    }
}
