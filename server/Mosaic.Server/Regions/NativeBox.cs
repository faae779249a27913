using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;

namespace Mosaic.Server.Regions;

/// <summary>
/// Native pixels of a box for display: a chip's straight from its plane, a canvas's from its pyramid, which
/// stores the native level resampled once at build time (the canvas plane resamples on every read).
/// </summary>
public static class NativeBox
{
    /// <summary>
    /// The box's rows from its <paramref name="firstRowFromTop"/>-th (0 = FITS y = Y1) into destination, as many
    /// as it holds whole rows of box.Width, top row first. A canvas whose pyramid is not built yet throws
    /// PyramidNotReadyException.
    /// </summary>
    public static void ReadRows(PyramidService pyramids, FieldHdu hdu, PixelBox box, int firstRowFromTop, Span<float> destination)
    {
        ArgumentNullException.ThrowIfNull(pyramids);
        ArgumentNullException.ThrowIfNull(hdu);
        var rows = destination.Length / box.Width;
        if (rows * box.Width != destination.Length || firstRowFromTop < 0 || firstRowFromTop + rows > box.Height)
            throw new ArgumentOutOfRangeException(nameof(firstRowFromTop), firstRowFromTop,
                $"{destination.Length} floats from row {firstRowFromTop} are not whole rows of the {box.Width} x {box.Height} box");
        if (hdu.IsCanvas)
        {
            var pyramid = pyramids.GetReady(hdu);
            // The pyramid is top-anchored: FITS y = Y1 is native row Height - Y1 from the top.
            pyramid.ReadRegion(pyramid.Geometry.MaxZoom, box.X0 - 1, hdu.Plane.Height - box.Y1 + firstRowFromTop, box.Width, rows, destination);
            return;
        }
        for (var k = 0; k < rows; k++)
            hdu.Plane.ReadRow(box.StoredRowFromTop(firstRowFromTop + k), box.X0 - 1, destination.Slice(k * box.Width, box.Width));
    }
}
