namespace Mosaic.Imaging.Rendering;

/// <summary>Rows read on demand into one band buffer (from <paramref name="start"/> in it), overwritten by each read.</summary>
internal readonly struct ReaderRows(RowBandReader reader, float[] band, int width, int start = 0) : IValueRows
{
    public ReadOnlySpan<float> Read(int firstRow, int rowCount)
    {
        var destination = band.AsSpan(start, rowCount * width);
        reader(firstRow, destination);
        return destination;
    }
}
