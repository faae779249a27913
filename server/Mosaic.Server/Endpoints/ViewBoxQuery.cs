using System.Globalization;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Sky;

namespace Mosaic.Server.Endpoints;

/// <summary>The visible box and screen size a /sky request names, checked, with errors naming the parameter.</summary>
public static class ViewBoxQuery
{
    public const double MaxScreen = 10_000;

    /// <summary>How many image sizes a box may span or lie away from the image before it is refused as absurd.</summary>
    public const double MaxImageSizes = 64;

    public static ViewBox Required(FieldHdu hdu, string? x0, string? y0, string? x1, string? y1, string? width, string? height)
    {
        double left = QueryParameters.RequiredFinite("x0", x0), bottom = QueryParameters.RequiredFinite("y0", y0);
        double right = QueryParameters.RequiredFinite("x1", x1), top = QueryParameters.RequiredFinite("y1", y1);
        double screenWidth = QueryParameters.RequiredFinite("width", width), screenHeight = QueryParameters.RequiredFinite("height", height);
        if (right <= left) throw MosaicRequestException.BadParameter("x1", $"'x1' ({Text(right)}) must be greater than 'x0' ({Text(left)}).");
        if (top <= bottom) throw MosaicRequestException.BadParameter("y1", $"'y1' ({Text(top)}) must be greater than 'y0' ({Text(bottom)}).");
        Screen("width", screenWidth);
        Screen("height", screenHeight);

        var size = (double)Math.Max(hdu.Plane.Width, hdu.Plane.Height);
        var limit = MaxImageSizes * size;
        Near("x0", left, hdu.Plane.Width, limit);
        Near("x1", right, hdu.Plane.Width, limit);
        Near("y0", bottom, hdu.Plane.Height, limit);
        Near("y1", top, hdu.Plane.Height, limit);
        if (right - left > limit)
            throw MosaicRequestException.BadParameter("x1", $"The box is {Text(right - left)} pixels wide: more than {MaxImageSizes} times the image ({size} pixels).");
        if (top - bottom > limit)
            throw MosaicRequestException.BadParameter("y1", $"The box is {Text(top - bottom)} pixels high: more than {MaxImageSizes} times the image ({size} pixels).");
        return new ViewBox(left, bottom, right, top, screenWidth, screenHeight);
    }

    private static void Screen(string name, double value)
    {
        if (value < 1 || value > MaxScreen)
            throw MosaicRequestException.BadParameter(name, $"'{name}' = {Text(value)} must be between 1 and {MaxScreen} screen pixels.");
    }

    private static void Near(string name, double value, int extent, double limit)
    {
        if (value < 0.5 - limit || value > extent + 0.5 + limit)
            throw MosaicRequestException.BadParameter(name, $"'{name}' = {Text(value)} lies more than {MaxImageSizes} image sizes from the image.");
    }

    private static string Text(double value) => value.ToString("R", CultureInfo.InvariantCulture);
}
