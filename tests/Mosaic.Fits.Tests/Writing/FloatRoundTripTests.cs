using Mosaic.Fits.Tests.Support;
using Mosaic.Fits.Writing;

namespace Mosaic.Fits.Tests.Writing;

/// <summary>BITPIX -32 written by FitsWriter and read back by FitsFile: the path the demo generator relies on.</summary>
public sealed class FloatRoundTripTests : IDisposable
{
    private readonly TempFolder _temp = new();

    public void Dispose() => _temp.Dispose();

    private static float[] Pattern(int width, int height)
    {
        var data = new float[width * height];
        for (var y = 0; y < height; y++)
            for (var x = 0; x < width; x++)
                data[y * width + x] = MathF.Sin(x * 0.37f) * 1000f + y * 0.001f - 3.5e-7f * x * y;
        data[5] = float.NaN;
        data[6] = float.MaxValue;
        data[7] = -float.Epsilon;
        return data;
    }

    [Fact]
    public void MultiExtensionFloatImagesReadBackBitExact()
    {
        var path = _temp.File("roundtrip.fits");
        var a = Pattern(37, 23);
        var b = Pattern(101, 3);
        using (var writer = new FitsWriter(File.Create(path)))
        {
            writer.WriteEmptyPrimary([new HeaderCard("ORIGIN", "unit test", null)]);
            writer.WriteFloatImage([new HeaderCard("EXTNAME", "CHIP1", null)], 37, 23, a);
            writer.WriteFloatImage([new HeaderCard("EXTNAME", "CHIP2", null)], 101, 3, b);
        }

        // FITS 4.0 section 3.1: a file is a whole number of 2880-byte blocks.
        Assert.Equal(0, new FileInfo(path).Length % 2880);

        using var file = FitsFile.Open(path);
        Assert.Equal(3, file.Hdus.Count);
        Assert.Null(file.Hdus[0].Image);
        Assert.Equal("CHIP1", file.Hdus[1].ExtName);
        Assert.Equal("IMAGE", file.Hdus[2].XTension);

        var plane = file.Hdus[1].Image!;
        Assert.Equal((37, 23, -32), (plane.Width, plane.Height, plane.BitPix));
        var all = new float[37 * 23];
        plane.ReadRows(0, 23, all);
        Assert.Equal(a.Select(BitConverter.SingleToInt32Bits), all.Select(BitConverter.SingleToInt32Bits));

        var segment = new float[10];
        plane.ReadRow(4, 20, segment);
        Assert.Equal(a.AsSpan(4 * 37 + 20, 10).ToArray(), segment);
        Assert.Equal((double)a[22 * 37 + 36], file.Hdus[1].Image!.ReadValue(36, 22));
        Assert.True(double.IsNaN(plane.ReadValue(5, 0)));

        var rows = new float[101 * 2];
        file.Hdus[2].Image!.ReadRows(1, 2, rows);
        Assert.Equal(b.AsSpan(101).ToArray(), rows);
    }
}
