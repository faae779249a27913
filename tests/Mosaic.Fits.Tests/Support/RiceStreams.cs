using System.Buffers.Binary;

namespace Mosaic.Fits.Tests.Support;

/// <summary>
/// RICE_1 streams written from the layout of FITS 4.0 section 10.4.1 (first value in BYTEPIX bytes, then per block of
/// 32 a code-length field of 4 bits for 16-bit values: 0 = all differences zero, 15 = differences stored in 16 bits).
/// </summary>
public static class RiceStreams
{
    private const int BlockSize = 32;

    /// <summary>Every pixel <paramref name="value"/>: the first value, then one all-zero field per block.</summary>
    public static byte[] Constant16(short value, int pixels)
    {
        var blocks = (pixels + BlockSize - 1) / BlockSize;
        var stream = new byte[2 + (blocks * 4 + 7) / 8];
        BinaryPrimitives.WriteInt16BigEndian(stream, value);
        return stream;
    }

    /// <summary>0, 1, 2, ... : every block stored plainly, each difference 1 zig-zag mapped to 2 (even = non-negative).</summary>
    public static byte[] Ramp16(int pixels)
    {
        var bits = new List<bool>();
        void Put(uint v, int n) { for (var i = n - 1; i >= 0; i--) bits.Add(((v >> i) & 1) != 0); }
        for (var i = 0; i < pixels; i += BlockSize)
        {
            Put(15, 4);
            // The first difference is from the first value (0) to pixel 0, so 0; then +1 each.
            for (var k = i; k < Math.Min(pixels, i + BlockSize); k++) Put(k == 0 ? 0u : 2u, 16);
        }
        var stream = new byte[2 + (bits.Count + 7) / 8];
        for (var i = 0; i < bits.Count; i++)
            if (bits[i]) stream[2 + i / 8] |= (byte)(0x80 >> (i % 8));
        return stream;
    }
}
