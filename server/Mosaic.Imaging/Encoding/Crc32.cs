using System.Buffers.Binary;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace Mosaic.Imaging.Encoding;

/// <summary>
/// CRC-32 as PNG chunks use it (ISO 3309 / ITU-T V.42: reflected polynomial 0xEDB88320, initial and final value
/// all ones), table-driven eight bytes at a time ("slicing by 8").
/// </summary>
public static class Crc32
{
    private const uint Polynomial = 0xEDB88320;
    private static readonly uint[] Table = BuildTable();

    /// <summary>The CRC of data.</summary>
    public static uint Compute(ReadOnlySpan<byte> data) => Finish(Append(Start, data));

    /// <summary>Running register before any byte.</summary>
    public const uint Start = 0xFFFFFFFF;

    /// <summary>The final CRC from a running register.</summary>
    public static uint Finish(uint register) => ~register;

    /// <summary>Feeds bytes into a running register (begin with <see cref="Start"/>, end with <see cref="Finish"/>).</summary>
    public static uint Append(uint register, ReadOnlySpan<byte> data)
    {
        ref var t = ref MemoryMarshal.GetArrayDataReference(Table);
        ref var p = ref MemoryMarshal.GetReference(data);
        var crc = register;
        var i = 0;
        var n = data.Length;
        // Indices are masked to a byte and offset by whole tables, so they always fall inside the 8 x 256 table.
        for (; i <= n - 8; i += 8)
        {
            var one = BinaryPrimitives.ReadUInt32LittleEndian(MemoryMarshal.CreateReadOnlySpan(ref Unsafe.Add(ref p, i), 4)) ^ crc;
            var two = BinaryPrimitives.ReadUInt32LittleEndian(MemoryMarshal.CreateReadOnlySpan(ref Unsafe.Add(ref p, i + 4), 4));
            crc = Unsafe.Add(ref t, (int)(7 * 256 + (one & 0xFF))) ^ Unsafe.Add(ref t, (int)(6 * 256 + ((one >> 8) & 0xFF)))
                ^ Unsafe.Add(ref t, (int)(5 * 256 + ((one >> 16) & 0xFF))) ^ Unsafe.Add(ref t, (int)(4 * 256 + (one >> 24)))
                ^ Unsafe.Add(ref t, (int)(3 * 256 + (two & 0xFF))) ^ Unsafe.Add(ref t, (int)(2 * 256 + ((two >> 8) & 0xFF)))
                ^ Unsafe.Add(ref t, (int)(256 + ((two >> 16) & 0xFF))) ^ Unsafe.Add(ref t, (int)(two >> 24));
        }
        for (; i < n; i++) crc = Unsafe.Add(ref t, (int)((crc ^ Unsafe.Add(ref p, i)) & 0xFF)) ^ (crc >> 8);
        return crc;
    }

    // Table k holds the CRC of a byte followed by k zero bytes, so eight table reads advance eight bytes.
    private static uint[] BuildTable()
    {
        var table = new uint[8 * 256];
        for (uint n = 0; n < 256; n++)
        {
            var c = n;
            for (var k = 0; k < 8; k++) c = (c & 1) != 0 ? Polynomial ^ (c >> 1) : c >> 1;
            table[n] = c;
        }
        for (var n = 0; n < 256; n++)
            for (var k = 1; k < 8; k++)
                table[k * 256 + n] = table[(k - 1) * 256 + n] >> 8 ^ table[table[(k - 1) * 256 + n] & 0xFF];
        return table;
    }
}
