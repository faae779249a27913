namespace Mosaic.Fits.Compression;

/// <summary>One row of a compressed-image table: where a tile's bytes are and how its integers map back to values.</summary>
/// <param name="Row">0-based table row; the dither sequence is seeded from it (section 10.2.1).</param>
internal readonly record struct TileEntry(long Row, HeapSpan Compressed, HeapSpan Gzip, HeapSpan Uncompressed, double Scale, double Zero, long? NullValue);
