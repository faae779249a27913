namespace Mosaic.Fits.Compression;

/// <summary>A tile's bytes do not decode to the tile the header describes; the plane adds the file, HDU and tile.</summary>
internal sealed class TileDataException(string problem) : Exception(problem);
