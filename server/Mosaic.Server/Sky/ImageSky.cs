using Mosaic.Wcs.Header;
using FitsHeader = Mosaic.Fits.Header;

namespace Mosaic.Server.Sky;

/// <summary>
/// The celestial WCS of one image, read once: the transform, or why there is none (the image is still served for
/// its pixels), and the pixel scale at the image centre in arcseconds.
/// </summary>
public sealed record ImageSky(Mosaic.Wcs.Wcs? Wcs, string? Error, double? PixelScaleArcsec)
{
    public static ImageSky Read(FitsHeader header, int width, int height)
    {
        ArgumentNullException.ThrowIfNull(header);
        if (!header.Contains("CTYPE1") && !header.Contains("CTYPE2"))
            return new ImageSky(null, "the header has no celestial WCS (no CTYPE1/CTYPE2 keywords)", null);
        Mosaic.Wcs.Wcs wcs;
        try
        {
            wcs = Mosaic.Wcs.Wcs.From(header);
        }
        catch (WcsHeaderException e)
        {
            return new ImageSky(null, $"the celestial WCS cannot be used: {e.Message}", null);
        }
        catch (NotSupportedException e)
        {
            return new ImageSky(null, $"the celestial WCS is not supported: {e.Message}", null);
        }
        catch (ArgumentException e)
        {
            return new ImageSky(null, $"the celestial WCS cannot be used: {e.Message}", null);
        }
        // FITS pixel centres run 1..N, so the image centre is (N + 1) / 2.
        var scale = SkyOrientation.At(wcs, (width + 1) / 2.0, (height + 1) / 2.0)?.PixelScaleArcsec;
        return new ImageSky(wcs, null, scale);
    }
}
