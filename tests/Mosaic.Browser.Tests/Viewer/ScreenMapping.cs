namespace Mosaic.Browser.Tests.Viewer;

/// <summary>
/// Where a FITS pixel position appears in the image view, from the contract the client implements: map units are
/// FITS pixels (x to the right, y up: north at the top), the view's centre is at the middle of the view, and one
/// image pixel spans 2^(z - maxZoom) screen pixels.
/// </summary>
public sealed record ScreenMapping(double ViewWidth, double ViewHeight, double CentreX, double CentreY, double Zoom, int MaxZoom)
{
    public double Scale => Math.Pow(2, Zoom - MaxZoom);

    public (double X, double Y) ToContainer(double fitsX, double fitsY) =>
        (ViewWidth / 2 + (fitsX - CentreX) * Scale, ViewHeight / 2 - (fitsY - CentreY) * Scale);

    public (double X, double Y) ToFits(double containerX, double containerY) =>
        (CentreX + (containerX - ViewWidth / 2) / Scale, CentreY - (containerY - ViewHeight / 2) / Scale);

    /// <summary>
    /// FITS pixel i covers [i - 0.5, i + 0.5): WCS Paper I (Greisen &amp; Calabretta 2002) puts integer pixel
    /// coordinates at pixel centres (from memory); the half-open edge is this API's documented choice.
    /// </summary>
    public static int ContainingPixel(double coordinate) => (int)Math.Floor(coordinate + 0.5);
}
