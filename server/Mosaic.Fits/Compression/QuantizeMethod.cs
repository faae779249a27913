namespace Mosaic.Fits.Compression;

/// <summary>How floating-point tiles were turned into integers (ZQUANTIZ, FITS 4.0 section 10.2).</summary>
internal enum QuantizeMethod
{
    /// <summary>Not quantised: the tiles hold the floating-point values themselves.</summary>
    Lossless,
    NoDither,
    SubtractiveDither1,
    SubtractiveDither2,
}
