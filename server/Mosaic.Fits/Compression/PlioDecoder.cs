namespace Mosaic.Fits.Compression;

/// <summary>
/// PLIO_1 (FITS 4.0 section 10.4.3): a line list of 16-bit words, each a 3-bit opcode and 12 bits of data — runs of
/// zeros, runs of the current high value, a zero run ending in one high-value pixel, changes of the high value, and
/// single pixels after a change. The list starts with a header giving its own length (7 words; 3 in the old form).
/// </summary>
internal static class PlioDecoder
{
    public static void Decode(ReadOnlySpan<short> list, Span<int> pixels)
    {
        if (list.Length < 3) throw new TileDataException("the PLIO_1 line list is shorter than its header");
        int length, first;
        if (list[2] > 0)
        {
            // Old header: word 3 is the list length, the instructions start at word 4.
            length = list[2];
            first = 3;
        }
        else
        {
            if (list.Length < 5) throw new TileDataException("the PLIO_1 line list is shorter than its header");
            length = (list[4] << 15) + list[3];
            first = list[1];
        }
        if (length > list.Length || first < 3 || first > length)
            throw new TileDataException($"the PLIO_1 header gives a list of {length} words from word {first + 1}, but the column holds {list.Length}");

        var n = pixels.Length;
        var written = 0;
        long x1 = 1;
        var value = 1;
        for (var ip = first; ip < length; ip++)
        {
            int word = list[ip];
            if (word < 0) throw new TileDataException($"PLIO_1 word {ip + 1} has its unused top bit set");
            var opcode = word >> 12;
            var data = word & 4095;
            switch (opcode)
            {
                case 0 or 4 or 5:
                {
                    // A run of `data` pixels: zeros (0), the high value (4), or zeros ending in the high value (5).
                    var x2 = x1 + data - 1;
                    var count = (int)(Math.Min(x2, n) - x1 + 1);
                    if (count > 0)
                    {
                        pixels.Slice(written, count).Fill(opcode == 4 ? value : 0);
                        if (opcode == 5 && x2 <= n) pixels[written + count - 1] = value;
                        written += count;
                    }
                    x1 = x2 + 1;
                    break;
                }
                case 1:
                    if (ip + 1 >= length) throw new TileDataException("the PLIO_1 list ends inside a set-value instruction");
                    value = (list[ip + 1] << 12) + data;
                    ip++;
                    break;
                case 2:
                    value += data;
                    break;
                case 3:
                    value -= data;
                    break;
                default:
                    // 6 and 7: change the value by data, then one pixel of it.
                    value += opcode == 6 ? data : -data;
                    if (x1 <= n) pixels[written++] = value;
                    x1++;
                    break;
            }
            if (x1 > n) return;
        }
        pixels[written..].Clear();
    }
}
