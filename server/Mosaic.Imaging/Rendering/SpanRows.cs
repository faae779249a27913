namespace Mosaic.Imaging.Rendering;

/// <summary>Rows already in memory: every band is a view, nothing is copied.</summary>
internal readonly ref struct SpanRows(ReadOnlySpan<float> valuesTopDown, int width) : IValueRows
{
    private readonly ReadOnlySpan<float> _values = valuesTopDown;

    public ReadOnlySpan<float> Read(int firstRow, int rowCount) => _values.Slice(firstRow * width, rowCount * width);
}
