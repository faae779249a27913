using Mosaic.Fits.Pixels;

namespace Mosaic.Fits.Compression;

/// <summary>A tile's first-plane samples as big-endian values of the image's BITPIX, with the scaling that turns them into physical values.</summary>
internal sealed class DecodedTile(byte[] samples, int width, int height, SampleScaling scaling)
{
    public byte[] Samples { get; } = samples;
    public int Width { get; } = width;
    public int Height { get; } = height;
    public SampleScaling Scaling { get; } = scaling;
}
