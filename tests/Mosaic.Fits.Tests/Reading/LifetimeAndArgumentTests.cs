using Mosaic.Fits.Tests.Support;
using Mosaic.Fits.Writing;

namespace Mosaic.Fits.Tests.Reading;

/// <summary>Reads against a file that changes under the reader, after dispose, and with bad arguments.</summary>
public sealed class LifetimeAndArgumentTests : IDisposable
{
    private readonly TempFolder _temp = new();

    public void Dispose() => _temp.Dispose();

    private string WriteImage(int width, int height, int bitPix = -32)
    {
        var path = _temp.File(Guid.NewGuid() + ".fits");
        using var writer = new FitsWriter(File.Create(path));
        if (bitPix == -32) writer.WriteFloatImage([], width, height, new float[width * height]);
        else writer.WriteRawImage([], bitPix, [width, height], new byte[width * height * Math.Abs(bitPix) / 8]);
        return path;
    }

    [Theory]
    [InlineData(-32)]
    [InlineData(16)]
    public void FileTruncatedAfterOpenGivesAFormatErrorOnRead(int bitPix)
    {
        var path = WriteImage(300, 200, bitPix);
        using var file = FitsFile.Open(path);
        var plane = (RawImagePlane)file.Hdus[0].Image!;
        // Cut the file inside the data, as a rewrite in place would, while it stays open for reading.
        using (var stream = new FileStream(path, FileMode.Open, FileAccess.Write, FileShare.ReadWrite | FileShare.Delete))
            stream.SetLength(plane.DataOffset + 1000);

        var rows = new float[300 * 200];
        var e = Assert.Throws<FitsFormatException>(() => plane.ReadRows(0, 200, rows));
        Assert.Contains("truncated data", e.Message);
        Assert.Equal(0, e.HduIndex);
        Assert.Throws<FitsFormatException>(() => plane.ReadRow(150, 0, new float[10]));
        Assert.Throws<FitsFormatException>(() => plane.ReadValue(299, 199));
        // A block read (one positional read per row, straight from the descriptor) reports the same error.
        var block = Assert.Throws<FitsFormatException>(() => plane.ReadBlock(0, 199, 256, 50, -1, rows));
        Assert.Contains("truncated data", block.Message);
        // The start of the data is still there and still readable: the process and the handle are fine.
        Assert.Equal(0.0, plane.ReadValue(0, 0));
    }

    [Fact]
    public void ReadsAfterDisposeThrowObjectDisposed()
    {
        var file = FitsFile.Open(WriteImage(10, 10));
        var plane = file.Hdus[0].Image!;
        file.Dispose();
        Assert.Throws<ObjectDisposedException>(() => plane.ReadValue(0, 0));
        Assert.Throws<ObjectDisposedException>(() => plane.ReadRow(0, 0, new float[10]));
        Assert.Throws<ObjectDisposedException>(() => plane.ReadRows(0, 1, new float[10]));
        Assert.Throws<ObjectDisposedException>(() => plane.ReadBlock(0, 9, 10, 10, -1, new float[100]));
    }

    [Fact]
    public void TheFileCanBeDeletedWhileOpen()
    {
        var path = WriteImage(10, 10);
        using var file = FitsFile.Open(path);
        // FileShare.Delete: a served file can be replaced; the open handle keeps reading the old one.
        File.Delete(path);
        Assert.Equal(0.0, file.Hdus[0].Image!.ReadValue(9, 9));
    }

    [Fact]
    public void ArgumentsOutsideThePlaneAreRejected()
    {
        using var file = FitsFile.Open(WriteImage(10, 5));
        var p = file.Hdus[0].Image!;
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadValue(10, 0));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadValue(0, 5));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadValue(-1, 0));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadRow(5, 0, new float[1]));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadRow(0, 4, new float[7]));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadRow(0, -1, new float[1]));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadRows(3, 3, new float[30]));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadRows(0, 2, new float[19]));
        Assert.Throws<ArgumentOutOfRangeException>(() => p.ReadRows(-1, 1, new float[10]));
    }

    [Fact]
    public void WriterArgumentsAreValidated()
    {
        using var writer = new FitsWriter(new MemoryStream());
        Assert.Throws<ArgumentException>(() => writer.WriteFloatImage([], 3, 3, new float[8]));
        Assert.Throws<ArgumentOutOfRangeException>(() => writer.WriteRawImage([], 24, [2], new byte[6]));
        Assert.Throws<ArgumentException>(() => writer.WriteRawImage([], 16, [2, 2], new byte[6]));
        Assert.Throws<ArgumentOutOfRangeException>(() => writer.WriteRawImage([], 8, [-1], new byte[0]));
        // FITS 4.0 section 4.4.2.5: BLANK shall not be used with floating-point data.
        Assert.Throws<ArgumentException>(() => writer.WriteFloatImage([new HeaderCard("BLANK", -1L, null)], 1, 1, new float[1]));
        writer.WriteEmptyPrimary([]);
        Assert.Throws<InvalidOperationException>(() => writer.WriteEmptyPrimary([]));
        writer.Dispose();
        Assert.Throws<ObjectDisposedException>(() => writer.WriteFloatImage([], 1, 1, new float[1]));
    }
}
