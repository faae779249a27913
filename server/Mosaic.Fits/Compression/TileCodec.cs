namespace Mosaic.Fits.Compression;

/// <summary>The ZCMPTYPE values of FITS 4.0 section 10.4.</summary>
internal enum TileCodec
{
    Rice,
    Gzip1,
    Gzip2,
    NoCompress,
    Plio,
    HCompress,
}
