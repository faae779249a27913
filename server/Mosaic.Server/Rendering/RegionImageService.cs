using Mosaic.Imaging.Composite;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Rendering;
using Mosaic.Server.Composite;
using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;
using Mosaic.Server.Regions;
using Mosaic.Server.Tiles;

namespace Mosaic.Server.Rendering;

/// <summary>A PNG of a pixel box of one HDU at native resolution, with the field-wide display of its band.</summary>
public sealed class RegionImageService(DisplayCompiler displays, PyramidService pyramids)
{
    public const long MaxPixels = RegionRenderer.MaxPixels;

    /// <param name="cancellationToken">Checked before each band of rows, so a request timeout stops a long render.</param>
    public byte[] RenderPng(FieldHdu hdu, PixelBox box, DisplaySettings display, CancellationToken cancellationToken = default)
    {
        if (box.PixelCount > MaxPixels)
            throw new ArgumentOutOfRangeException(nameof(box), box, $"the box holds {box.PixelCount} pixels; at most {MaxPixels} are rendered");
        if (!box.FitsInside(hdu.Plane.Width, hdu.Plane.Height))
            throw new ArgumentOutOfRangeException(nameof(box), box, $"the box runs past the {hdu.Plane.Width} x {hdu.Plane.Height} image");
        // Compiled before reading, so a band still being prepared fails fast without touching the pixels.
        var toneMap = displays.ToneMapFor(hdu.Band, display);
        // Rows on demand, a bounded band at a time: a 50-megapixel box never sits in memory as floats.
        return RegionRenderer.RenderPng((firstRowFromTop, destination) =>
            {
                cancellationToken.ThrowIfCancellationRequested();
                NativeBox.ReadRows(pyramids, hdu, box, firstRowFromTop, destination);
            },
            box.Width, box.Height, toneMap, display.Masked);
    }

    /// <summary>A colour PNG of the same box of three HDUs on one grid, each band's rows read on demand.</summary>
    public byte[] RenderCompositePng(CompositeTarget target, PixelBox box, ICompositeSettings composite, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(target);
        ArgumentNullException.ThrowIfNull(composite);
        var plane = target.Hdus.Red.Plane;
        if (box.PixelCount > MaxPixels)
            throw new ArgumentOutOfRangeException(nameof(box), box, $"the box holds {box.PixelCount} pixels; at most {MaxPixels} are rendered");
        if (!box.FitsInside(plane.Width, plane.Height))
            throw new ArgumentOutOfRangeException(nameof(box), box, $"the box runs past the {plane.Width} x {plane.Height} image");
        var map = displays.CompositeFor(target.Bands, composite);
        var readers = target.Hdus.Select(hdu => (RowBandReader)((firstRowFromTop, destination) =>
        {
            cancellationToken.ThrowIfCancellationRequested();
            for (var offset = 0; offset < destination.Length; offset += box.Width, firstRowFromTop++)
                hdu.Plane.ReadRow(box.StoredRowFromTop(firstRowFromTop), box.X0 - 1, destination.Slice(offset, box.Width));
        }));
        return CompositeRenderer.RenderPng(readers, box.Width, box.Height, map, composite.Masked);
    }
}
