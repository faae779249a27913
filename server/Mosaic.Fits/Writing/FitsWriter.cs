using System.Buffers;
using System.Buffers.Binary;
using System.Runtime.InteropServices;
using System.Text;

namespace Mosaic.Fits.Writing;

/// <summary>
/// Writes standard FITS: a primary HDU then IMAGE extensions, each header padded to 2880-byte blocks and data
/// big-endian, padded with zeros. The caller gives only its own cards; the writer puts the mandatory ones
/// (SIMPLE/XTENSION, BITPIX, NAXISn, EXTEND, PCOUNT, GCOUNT) first, in the order the standard requires.
/// </summary>
public sealed class FitsWriter : IDisposable
{
    private const int BlockSize = 2880;

    private readonly Stream _stream;
    private readonly bool _leaveOpen;
    private bool _primaryWritten;
    private bool _disposed;
    private FitsImageData? _open;

    public FitsWriter(Stream stream, bool leaveOpen = false)
    {
        ArgumentNullException.ThrowIfNull(stream);
        if (!stream.CanWrite) throw new ArgumentException("The stream must be writable.", nameof(stream));
        _stream = stream;
        _leaveOpen = leaveOpen;
    }

    /// <summary>A primary HDU without data (NAXIS = 0, EXTEND = T), for multi-extension files.</summary>
    public void WriteEmptyPrimary(IEnumerable<HeaderCard> cards)
    {
        ObjectDisposedException.ThrowIf(_disposed, this);
        if (_primaryWritten) throw new InvalidOperationException("The primary HDU has already been written.");
        ThrowIfDataOpen();
        WriteHeader(cards, bitPix: 8, axes: []);
    }

    /// <summary>A BITPIX -32 image (the primary HDU if none has been written yet, else an IMAGE extension). Row 0 of data is FITS y = 1.</summary>
    public void WriteFloatImage(IEnumerable<HeaderCard> cards, int width, int height, ReadOnlySpan<float> data)
    {
        ObjectDisposedException.ThrowIf(_disposed, this);
        ArgumentOutOfRangeException.ThrowIfNegative(width);
        ArgumentOutOfRangeException.ThrowIfNegative(height);
        if ((long)width * height != data.Length)
            throw new ArgumentException($"data holds {data.Length} values but width x height is {(long)width * height}.", nameof(data));
        var sink = BeginImage(cards, -32, [width, height]);
        sink.WriteFloats(data);
        sink.Complete();
    }

    /// <summary>Any BITPIX, with data already big-endian in the stored type (for cutouts that keep the original type).</summary>
    public void WriteRawImage(IEnumerable<HeaderCard> cards, int bitPix, IReadOnlyList<long> axes, ReadOnlySpan<byte> bigEndianData)
    {
        var expected = DataBytes(bitPix, axes);
        if (expected != bigEndianData.Length)
            throw new ArgumentException($"bigEndianData holds {bigEndianData.Length} bytes but the axes and BITPIX need {expected}.", nameof(bigEndianData));
        var data = BeginImage(cards, bitPix, axes);
        data.WriteBigEndian(bigEndianData);
        data.Complete();
    }

    /// <summary>
    /// Writes the header of an image HDU (the primary if none yet, else an IMAGE extension) and returns the sink its
    /// data go through, a strip at a time, so an image never has to be held whole. No other HDU may be written until
    /// <see cref="FitsImageData.Complete"/> has padded this one.
    /// </summary>
    public FitsImageData BeginImage(IEnumerable<HeaderCard> cards, int bitPix, IReadOnlyList<long> axes)
    {
        ObjectDisposedException.ThrowIf(_disposed, this);
        ThrowIfDataOpen();
        var expected = DataBytes(bitPix, axes);
        WriteHeader(cards, bitPix, axes);
        _open = new FitsImageData(this, _stream, bitPix, expected);
        return _open;
    }

    /// <summary>Called by the open data sink once its bytes are all written.</summary>
    internal void EndData(FitsImageData data, long length)
    {
        if (!ReferenceEquals(_open, data)) throw new InvalidOperationException("This image's data were already completed.");
        PadData(length);
        _open = null;
    }

    private void ThrowIfDataOpen()
    {
        if (_open is not null)
            throw new InvalidOperationException("The previous image's data are not complete; call Complete() on its FitsImageData first.");
    }

    private static long DataBytes(int bitPix, IReadOnlyList<long> axes)
    {
        ArgumentNullException.ThrowIfNull(axes);
        if (bitPix is not (8 or 16 or 32 or 64 or -32 or -64))
            throw new ArgumentOutOfRangeException(nameof(bitPix), bitPix, "BITPIX must be 8, 16, 32, 64, -32 or -64 (FITS 4.0 table 8).");
        if (axes.Count > 999)
            throw new ArgumentOutOfRangeException(nameof(axes), axes.Count, "NAXIS must be at most 999 (FITS 4.0 section 4.4.1.1).");
        long expected = axes.Count == 0 ? 0 : Math.Abs(bitPix) / 8;
        try
        {
            foreach (var n in axes)
            {
                ArgumentOutOfRangeException.ThrowIfNegative(n, nameof(axes));
                expected = checked(expected * n);
            }
        }
        catch (OverflowException)
        {
            throw new ArgumentException("The product of the axis lengths overflows 64 bits.", nameof(axes));
        }
        return expected;
    }

    /// <summary>Flushes and (unless leaveOpen) closes the stream; an image whose data are incomplete is left truncated.</summary>
    public void Dispose()
    {
        if (_disposed) return;
        _disposed = true;
        _stream.Flush();
        if (!_leaveOpen) _stream.Dispose();
    }

    private void WriteHeader(IEnumerable<HeaderCard> cards, int bitPix, IReadOnlyList<long> axes)
    {
        ArgumentNullException.ThrowIfNull(cards);
        var primary = !_primaryWritten;
        var sb = new StringBuilder(BlockSize);
        CardFormatter.Append(sb, primary ? new HeaderCard("SIMPLE", true, "conforms to FITS standard")
                                         : new HeaderCard("XTENSION", "IMAGE", "image extension"));
        CardFormatter.Append(sb, new HeaderCard("BITPIX", (long)bitPix, "bits per data value"));
        CardFormatter.Append(sb, new HeaderCard("NAXIS", (long)axes.Count, "number of axes"));
        for (var i = 0; i < axes.Count; i++)
            CardFormatter.Append(sb, new HeaderCard($"NAXIS{i + 1}", axes[i], null));
        if (primary) CardFormatter.Append(sb, new HeaderCard("EXTEND", true, "extensions may follow"));
        else
        {
            CardFormatter.Append(sb, new HeaderCard("PCOUNT", 0L, null));
            CardFormatter.Append(sb, new HeaderCard("GCOUNT", 1L, null));
        }

        foreach (var card in cards)
        {
            ArgumentNullException.ThrowIfNull(card, nameof(cards));
            if (KeywordRules.IsWriterOwned(card.Keyword))
                throw new ArgumentException($"Keyword '{card.Keyword}' is written by FitsWriter itself and cannot be given as a card.", nameof(cards));
            if (bitPix < 0 && card.Keyword == "BLANK")
                throw new ArgumentException("BLANK is only for integer data; floating-point images mark missing pixels with NaN (FITS 4.0 section 4.4.2.5).", nameof(cards));
            CardFormatter.Append(sb, card);
        }
        sb.Append("END".PadRight(CardFormatter.CardLength));
        var padded = (sb.Length + BlockSize - 1) / BlockSize * BlockSize;
        sb.Append(' ', padded - sb.Length);

        // Everything was validated as printable ASCII, so one char is one byte.
        var bytes = Encoding.ASCII.GetBytes(sb.ToString());
        _stream.Write(bytes);
        _primaryWritten = true;
    }

    private void PadData(long length)
    {
        var rest = (int)(length % BlockSize);
        if (rest == 0) return;
        Span<byte> zeros = stackalloc byte[BlockSize - rest];
        zeros.Clear();
        _stream.Write(zeros);
    }
}
