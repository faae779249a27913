using System.Buffers.Binary;
using System.Text;
using Mosaic.Fits.Tests.Support;

namespace Mosaic.Fits.Tests.Compressed;

/// <summary>An fpack file with chosen header cards or heap descriptors of its compressed HDU (HDU 1) rewritten.</summary>
public sealed class PatchedFile(byte[] bytes)
{
    private const int Block = 2880;
    private const int TableHdu = 1;

    public static PatchedFile Of(string path) => new(File.ReadAllBytes(path));

    /// <summary>Replaces the value of an existing card of the table header (FITS 4.0 section 4.1: 80-character records).</summary>
    public PatchedFile Card(string keyword, string value)
    {
        var (start, end) = HeaderOf(TableHdu);
        for (var at = start; at < end; at += 80)
            if (Encoding.ASCII.GetString(bytes, at, 8).TrimEnd() == keyword)
            {
                Encoding.ASCII.GetBytes(FitsBytes.Card(keyword, value).PadRight(80)).CopyTo(bytes, at);
                return this;
            }
        throw new InvalidOperationException($"{keyword} is not in the table header");
    }

    /// <summary>Rewrites the heap offset of the first row's 1P descriptor in the first column (section 7.3.5).</summary>
    public PatchedFile FirstDescriptorOffset(int offset)
    {
        var (_, end) = HeaderOf(TableHdu);
        var data = (end + Block - 1) / Block * Block;
        BinaryPrimitives.WriteInt32BigEndian(bytes.AsSpan(data + 4), offset);
        return this;
    }

    /// <summary>Flips bytes in the middle of the first tile's compressed stream.</summary>
    public PatchedFile CorruptFirstTile()
    {
        var (_, end) = HeaderOf(TableHdu);
        var data = (end + Block - 1) / Block * Block;
        var count = BinaryPrimitives.ReadInt32BigEndian(bytes.AsSpan(data));
        var offset = BinaryPrimitives.ReadInt32BigEndian(bytes.AsSpan(data + 4));
        var rows = ReadInteger("NAXIS2") * ReadInteger("NAXIS1");
        var heap = data + rows + offset;
        for (var i = count / 3; i < count; i++) bytes[heap + i] ^= 0x5A;
        return this;
    }

    public string WriteTo(string path)
    {
        File.WriteAllBytes(path, bytes);
        return path;
    }

    private int ReadInteger(string keyword)
    {
        var (start, end) = HeaderOf(TableHdu);
        for (var at = start; at < end; at += 80)
            if (Encoding.ASCII.GetString(bytes, at, 8).TrimEnd() == keyword)
                return int.Parse(Encoding.ASCII.GetString(bytes, at + 10, 20).Trim());
        throw new InvalidOperationException($"{keyword} is not in the table header");
    }

    /// <summary>Byte range of HDU n's header records up to END; assumes the HDUs before it have no data (as fpack's empty primary).</summary>
    private (int Start, int End) HeaderOf(int hdu)
    {
        var at = 0;
        for (var h = 0; ; h++)
        {
            var start = at;
            while (Encoding.ASCII.GetString(bytes, at, 8) != "END     ") at += 80;
            if (h == hdu) return (start, at);
            at = (at + 80 + Block - 1) / Block * Block;
        }
    }
}
