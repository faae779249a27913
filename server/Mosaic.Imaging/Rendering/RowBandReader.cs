namespace Mosaic.Imaging.Rendering;

/// <summary>
/// Fills <paramref name="destination"/> with whole rows of a region, top row first: rows
/// [firstRowFromTop, firstRowFromTop + destination.Length / width), NaN where masked. Every float must be written.
/// </summary>
public delegate void RowBandReader(int firstRowFromTop, Span<float> destination);
