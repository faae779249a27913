namespace Mosaic.Imaging.Pyramids;

/// <summary>
/// The native pixels a pyramid is built from, as full-width rows in storage order: row 0 is the BOTTOM of the
/// image (FITS y = 1). A FITS plane is one; a canvas resampled from many chips can be another.
/// </summary>
internal interface IRowSource
{
    int Width { get; }

    int Height { get; }

    /// <summary>Rows [y, y + rowCount) into destination (rowCount * Width floats), row y first; NaN where masked.</summary>
    void ReadRows(int y, int rowCount, Span<float> destination);
}
