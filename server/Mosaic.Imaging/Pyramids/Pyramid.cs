using Mosaic.Fits;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Pyramids;

/// <summary>CONTRACT STUB: a built pyramid: the native level read from the source plane, reduced levels from the cache folder.</summary>
public sealed class Pyramid : IDisposable
{
    private Pyramid(PyramidGeometry geometry, ValueHistogram histogram) { Geometry = geometry; Histogram = histogram; }

    public PyramidGeometry Geometry { get; }

    /// <summary>Histogram of the native pixels.</summary>
    public ValueHistogram Histogram { get; }

    /// <summary>Opens a pyramid built by <see cref="PyramidBuilder"/>; InvalidDataException where the folder holds no complete build for this plane.</summary>
    public static Pyramid Open(string directory, ImagePlane native) => throw new NotImplementedException();

    /// <summary>One 256x256 tile of float values, row 0 at the top; NaN for masked pixels and outside the image.</summary>
    public void ReadTile(int z, int x, int y, Span<float> destination) => throw new NotImplementedException();

    public void Dispose() { }
}
