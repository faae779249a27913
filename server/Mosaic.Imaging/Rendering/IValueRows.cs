namespace Mosaic.Imaging.Rendering;

/// <summary>Where the composer gets its values: consecutive top-down rows, a band at a time.</summary>
internal interface IValueRows
{
    /// <summary>
    /// Rows [firstRow, firstRow + rowCount), top row first; valid until the next call (a reader reuses one buffer).
    /// </summary>
    ReadOnlySpan<float> Read(int firstRow, int rowCount);
}
