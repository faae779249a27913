using Mosaic.Imaging.Composite;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Rendering;

namespace Mosaic.Imaging.Tests.Composite;

/// <summary>A region read band by band gives the PNG of the same values held in memory, byte for byte.</summary>
public sealed class StreamedCompositeTests
{
    [Fact]
    public void Rows_read_on_demand_give_the_same_png_as_rows_in_memory()
    {
        // 2100 x 600 = 1.26 M floats a band: more than one band of RegionRenderer.BandFloats, so reads are split.
        const int width = 2100, height = 600;
        var bands = CompositeImages.Bands(width, height, holesIn: 0);
        var map = new LuptonSettings(8, 60).Compile(LuptonReferenceTests.Channels(bands));
        var inMemory = CompositeRenderer.RenderPng(bands[0], bands[1], bands[2], width, height, map, MaskedColor.Transparent);
        var reads = 0;
        RowBandReader Reader(float[] band) => (first, destination) =>
        {
            reads++;
            band.AsSpan(first * width, destination.Length).CopyTo(destination);
        };
        var streamed = CompositeRenderer.RenderPng(new Channels<RowBandReader>(Reader(bands[0]), Reader(bands[1]), Reader(bands[2])),
            width, height, map, MaskedColor.Transparent);
        Assert.Equal(inMemory, streamed);
        Assert.True(reads > 3, $"{reads} reads");
        // PNG colour type 6 (RGBA, W3C PNG 2003 table 11.1) at byte 25, since band 0 has holes.
        Assert.Equal(6, streamed[25]);
    }
}
