namespace Mosaic.Fits.Parsing;

/// <summary>The structure an HDU's mandatory keywords describe (FITS 4.0 sections 4.4.1 and 7).</summary>
/// <param name="Axes">NAXIS1..NAXISn.</param>
/// <param name="DataLength">Bytes of data without padding: |BITPIX| x GCOUNT x (PCOUNT + NAXIS1 x ... x NAXISn) / 8.</param>
/// <param name="HoldsImage">A primary array (not random groups) or an IMAGE extension.</param>
internal sealed record HduLayout(int BitPix, long[] Axes, long PCount, long GCount, long DataLength, bool HoldsImage);
