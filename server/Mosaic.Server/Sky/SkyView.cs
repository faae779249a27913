using Mosaic.Wcs.Coordinates;

namespace Mosaic.Server.Sky;

/// <summary>
/// What a client needs to draw sky coordinates over a view: the sky position of its centre (null where it has
/// none), the north and east directions and the pixel scale there, and the coordinate grid.
/// </summary>
public sealed record SkyView(PixelPoint Centre, SkyPosition? CentreSky, SkyOrientation? Orientation, double? PixelScaleArcsec, SkyGrid Grid)
{
    /// <param name="fallbackScale">The pixel scale to report when the view's centre has none (the image's own).</param>
    public static SkyView Compute(Mosaic.Wcs.Wcs wcs, ViewBox box, double? fallbackScale)
    {
        ArgumentNullException.ThrowIfNull(wcs);
        ArgumentNullException.ThrowIfNull(box);
        var centre = box.Centre;
        var sky = wcs.TryPixelToIcrs(centre.X, centre.Y, out var position) ? position : null;
        var orientation = sky is null ? null : SkyOrientation.At(wcs, centre.X, centre.Y);
        return new SkyView(centre, sky, orientation, orientation?.PixelScaleArcsec ?? fallbackScale, SkyGrid.Compute(wcs, box));
    }
}
