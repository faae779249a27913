using System.Buffers.Binary;

namespace Mosaic.Imaging.Tests.Encoding;

/// <summary>Splits a PNG into its chunks (PNG specification, W3C 2003, section 5.3: length, type, data, CRC).</summary>
internal static class PngChunks
{
    /// <summary>The eight signature bytes of section 5.2: 137 80 78 71 13 10 26 10.</summary>
    public static readonly byte[] Signature = [137, 80, 78, 71, 13, 10, 26, 10];

    public static List<(string Type, byte[] Data, uint Crc)> Read(byte[] png)
    {
        Assert.Equal(Signature, png[..8]);
        var chunks = new List<(string, byte[], uint)>();
        var at = 8;
        while (at < png.Length)
        {
            var length = BinaryPrimitives.ReadInt32BigEndian(png.AsSpan(at));
            var type = System.Text.Encoding.ASCII.GetString(png, at + 4, 4);
            var data = png.AsSpan(at + 8, length).ToArray();
            var crc = BinaryPrimitives.ReadUInt32BigEndian(png.AsSpan(at + 8 + length));
            chunks.Add((type, data, crc));
            at += 12 + length;
        }
        Assert.Equal(png.Length, at);
        return chunks;
    }

    /// <summary>CRC-32 bit by bit, as the sample code in the PNG specification's annex D computes it (without its table).</summary>
    public static uint BitwiseCrc(ReadOnlySpan<byte> typeAndData)
    {
        var c = 0xFFFFFFFFu;
        foreach (var b in typeAndData)
        {
            c ^= b;
            for (var k = 0; k < 8; k++) c = (c & 1) != 0 ? 0xEDB88320u ^ (c >> 1) : c >> 1;
        }
        return ~c;
    }
}
