namespace Mosaic.Fits.Tests.Compressed;

/// <summary>One file packed by fpack (Debian libcfitsio-bin) from a synthetic source image.</summary>
/// <param name="AstropyReads">Whether astropy's CompImageHDU decodes this codec too (it does not decode NOCOMPRESS).</param>
/// <param name="FunpackReads">
/// Whether funpack's output is a valid reference. For quantised floats in 2-D tiles the funpack of libcfitsio-bin 4.2
/// writes values far outside the quantisation bound of FITS 4.0 section 10.2 (up to ~100 quanta off, from the second
/// row of each tile on), while astropy (the same library reading whole tiles) stays within half a quantum; there the
/// reference is astropy, and <see cref="QuantisationBoundTests"/> checks the bound against the source.
/// </param>
public sealed record FpackCase(string Name, string Source, string[] Arguments, bool AstropyReads = true, bool FunpackReads = true)
{
    public override string ToString() => Name;
}
