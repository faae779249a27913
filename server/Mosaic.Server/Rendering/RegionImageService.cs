using Mosaic.Imaging.Display;
using Mosaic.Imaging.Rendering;
using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;
using Mosaic.Server.Regions;
using Mosaic.Server.Tiles;

namespace Mosaic.Server.Rendering;

/// <summary>A PNG of a pixel box of one HDU at native resolution, with the field-wide display of its band.</summary>
public sealed class RegionImageService(DisplayCompiler displays, PyramidService pyramids)
{
    public const long MaxPixels = RegionRenderer.MaxPixels;

    public byte[] RenderPng(FieldHdu hdu, PixelBox box, DisplaySettings display)
    {
        if (box.PixelCount > MaxPixels)
            throw new ArgumentOutOfRangeException(nameof(box), box, $"the box holds {box.PixelCount} pixels; at most {MaxPixels} are rendered");
        if (!box.FitsInside(hdu.Plane.Width, hdu.Plane.Height))
            throw new ArgumentOutOfRangeException(nameof(box), box, $"the box runs past the {hdu.Plane.Width} x {hdu.Plane.Height} image");
        // Compiled before reading, so a band still being prepared fails fast without touching the pixels.
        var toneMap = displays.ToneMapFor(hdu.Band, display);
        // Rows on demand, a bounded band at a time: a 50-megapixel box never sits in memory as floats.
        return RegionRenderer.RenderPng((firstRowFromTop, destination) => NativeBox.ReadRows(pyramids, hdu, box, firstRowFromTop, destination),
            box.Width, box.Height, toneMap, display.Masked);
    }
}
