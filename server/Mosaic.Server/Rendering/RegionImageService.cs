using Mosaic.Imaging.Display;
using Mosaic.Imaging.Rendering;
using Mosaic.Server.Fields;
using Mosaic.Server.Regions;
using Mosaic.Server.Tiles;

namespace Mosaic.Server.Rendering;

/// <summary>A PNG of a pixel box of one HDU at native resolution, with the field-wide display of its band.</summary>
public sealed class RegionImageService(DisplayCompiler displays)
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
        var values = GC.AllocateUninitializedArray<float>((int)box.PixelCount);
        for (var k = 0; k < box.Height; k++)
            hdu.Plane.ReadRow(box.StoredRowFromTop(k), box.X0 - 1, values.AsSpan(k * box.Width, box.Width));
        return RegionRenderer.RenderPng(values, box.Width, box.Height, toneMap, display.Masked);
    }
}
