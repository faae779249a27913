namespace Mosaic.Fits.Writing;

/// <summary>
/// Writes standard FITS: a primary HDU then IMAGE extensions, each header padded to 2880-byte blocks and data
/// big-endian, padded with zeros. The caller gives only its own cards; the writer puts the mandatory ones
/// (SIMPLE/XTENSION, BITPIX, NAXISn, EXTEND, PCOUNT, GCOUNT) first, in the order the standard requires.
/// </summary>
public sealed class FitsWriter : IDisposable
{
    public FitsWriter(Stream stream, bool leaveOpen = false) => throw new NotImplementedException();

    /// <summary>A primary HDU without data (NAXIS = 0, EXTEND = T), for multi-extension files.</summary>
    public void WriteEmptyPrimary(IEnumerable<HeaderCard> cards) => throw new NotImplementedException();

    /// <summary>A BITPIX -32 image (the primary HDU if none has been written yet, else an IMAGE extension). Row 0 of data is FITS y = 1.</summary>
    public void WriteFloatImage(IEnumerable<HeaderCard> cards, int width, int height, ReadOnlySpan<float> data) => throw new NotImplementedException();

    /// <summary>Any BITPIX, with data already big-endian in the stored type (for cutouts that keep the original type).</summary>
    public void WriteRawImage(IEnumerable<HeaderCard> cards, int bitPix, IReadOnlyList<long> axes, ReadOnlySpan<byte> bigEndianData) => throw new NotImplementedException();

    public void Dispose() => throw new NotImplementedException();
}
