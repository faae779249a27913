namespace Mosaic.Imaging.Rendering;

/// <summary>Rows read on demand into one band buffer, overwritten by each read.</summary>
internal readonly struct ReaderRows(RowBandReader reader, float[] band, int width) : IValueRows
{
    public ReadOnlySpan<float> Read(int firstRow, int rowCount)
    {
        var destination = band.AsSpan(0, rowCount * width);
        reader(firstRow, destination);
        return destination;
    }
}
