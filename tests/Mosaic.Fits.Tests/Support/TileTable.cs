using System.Buffers.Binary;

namespace Mosaic.Fits.Tests.Support;

/// <summary>
/// A tile-compressed image built byte by byte (FITS 4.0 section 10): an empty primary HDU, then a BINTABLE with one
/// 1PB COMPRESSED_DATA column holding one stream per tile in its heap. Each property can be set to something broken.
/// </summary>
public sealed class TileTable
{
    public int ZBitPix { get; init; } = 16;
    public long[] Axes { get; init; } = [16, 16];
    public long[] Tiles { get; init; } = [16, 16];
    public string Codec { get; init; } = "RICE_1";
    public required byte[][] Streams { get; init; }

    /// <summary>NAXIS2 of the table; by default one row per stream.</summary>
    public long? Rows { get; init; }

    /// <summary>Replaces the first row's descriptor (element count, heap offset; section 7.3.5).</summary>
    public (int Count, int Offset)? FirstDescriptor { get; init; }

    /// <summary>Cards added after the Z keywords, such as THEAP.</summary>
    public string[] ExtraCards { get; init; } = [];

    public byte[] ToArray()
    {
        var rows = Rows ?? Streams.Length;
        var heap = Streams.SelectMany(s => s).ToArray();
        var cards = new List<string>(FitsBytes.Extension("BINTABLE", 8, heap.Length, 1, 8, rows))
        {
            FitsBytes.Card("TFIELDS", "1".PadLeft(20)),
            FitsBytes.Card("TTYPE1", "'COMPRESSED_DATA'"),
            FitsBytes.Card("TFORM1", $"'1PB({Math.Max(1, Streams.Select(s => s.Length).DefaultIfEmpty(1).Max())})'"),
            FitsBytes.Card("ZIMAGE", "T".PadLeft(20)),
            FitsBytes.Card("ZBITPIX", ZBitPix.ToString().PadLeft(20)),
            FitsBytes.Card("ZNAXIS", Axes.Length.ToString().PadLeft(20)),
        };
        cards.AddRange(Axes.Select((n, i) => FitsBytes.Card($"ZNAXIS{i + 1}", n.ToString().PadLeft(20))));
        cards.AddRange(Tiles.Select((n, i) => FitsBytes.Card($"ZTILE{i + 1}", n.ToString().PadLeft(20))));
        cards.Add(FitsBytes.Card("ZCMPTYPE", $"'{Codec}'"));
        if (Codec == "RICE_1")
        {
            // Section 10.4.1: BLOCKSIZE and BYTEPIX, as fpack writes them for integer images.
            cards.Add(FitsBytes.Card("ZNAME1", "'BLOCKSIZE'"));
            cards.Add(FitsBytes.Card("ZVAL1", "32".PadLeft(20)));
            cards.Add(FitsBytes.Card("ZNAME2", "'BYTEPIX'"));
            cards.Add(FitsBytes.Card("ZVAL2", (Math.Abs(ZBitPix) / 8).ToString().PadLeft(20)));
        }
        cards.AddRange(ExtraCards);

        var table = new byte[8 * Math.Min(rows, Streams.Length)];
        var offset = 0;
        for (var r = 0; r < table.Length / 8; r++)
        {
            var (count, at) = r == 0 && FirstDescriptor is { } d ? d : (Streams[r].Length, offset);
            BinaryPrimitives.WriteInt32BigEndian(table.AsSpan(8 * r), count);
            BinaryPrimitives.WriteInt32BigEndian(table.AsSpan(8 * r + 4), at);
            offset += Streams[r].Length;
        }
        return new FitsBytes().Header(FitsBytes.Primary(8)).Header([.. cards]).Data([.. table, .. heap]).ToArray();
    }
}
