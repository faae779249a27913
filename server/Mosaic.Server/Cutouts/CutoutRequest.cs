using Mosaic.Server.Fields;
using Mosaic.Server.Regions;
using Mosaic.Wcs.Coordinates;

namespace Mosaic.Server.Cutouts;

/// <summary>A cutout resolved and checked: the HDU (a chip, or the band's canvas), the 1-based inclusive box, and how it was asked for.</summary>
/// <param name="Centre">The sky position asked for, where the box was given as a position and size.</param>
/// <param name="SizeArcsec">The width and height asked for in arcseconds, with a position.</param>
/// <param name="Clipped">True where a box from a position and size reached past the image and was cut at its edge.</param>
public sealed record CutoutRequest(FieldHdu Hdu, PixelBox Box, SkyPosition? Centre = null, (double Width, double Height)? SizeArcsec = null, bool Clipped = false)
{
    public FieldBand Band => Hdu.Band;
}
