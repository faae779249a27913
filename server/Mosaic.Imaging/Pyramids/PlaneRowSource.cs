using Mosaic.Fits;

namespace Mosaic.Imaging.Pyramids;

internal sealed class PlaneRowSource(ImagePlane plane) : IRowSource
{
    public int Width => plane.Width;

    public int Height => plane.Height;

    public void ReadRows(int y, int rowCount, Span<float> destination) => plane.ReadRows(y, rowCount, destination);
}
