using System.Buffers;
using System.Buffers.Binary;
using System.IO.Hashing;
using System.Security.Cryptography;
using System.Text;

namespace Mosaic.TileCache.Disk;

/// <summary>
/// One tile file: a 24-byte header (magic, format, key length, tile length, XxHash3 of the tile), the key in UTF-8,
/// then the tile. The key makes a file answer only for its own key; the lengths and hash catch a file cut short or
/// damaged after a crash (the rename is not followed by fsync: losing a cached tile is cheaper than syncing).
/// </summary>
internal static class DiskTileFile
{
    public const string Extension = ".tile";
    public const string TemporaryExtension = ".tmp";
    public const int HeaderBytes = 24;
    private const uint Magic = 0x4C49544D; // "MTIL" little-endian
    private const uint Format = 1;

    /// <summary>Hex of the first 128 bits of SHA-256 of the key: enough that two keys never share a file in practice.</summary>
    public static string NameOf(string key)
    {
        Span<byte> hash = stackalloc byte[32];
        SHA256.HashData(Encoding.UTF8.GetBytes(key), hash);
        return Convert.ToHexStringLower(hash[..16]);
    }

    public static bool IsTileName(ReadOnlySpan<char> fileName) =>
        fileName.Length == 32 + Extension.Length && fileName.EndsWith(Extension, StringComparison.Ordinal) && IsLowerHex(fileName[..32]);

    public static void WriteHeader(Span<byte> header, int keyBytes, ReadOnlySpan<byte> tile)
    {
        BinaryPrimitives.WriteUInt32LittleEndian(header, Magic);
        BinaryPrimitives.WriteUInt32LittleEndian(header[4..], Format);
        BinaryPrimitives.WriteInt32LittleEndian(header[8..], keyBytes);
        BinaryPrimitives.WriteInt32LittleEndian(header[12..], tile.Length);
        BinaryPrimitives.WriteUInt64LittleEndian(header[16..], XxHash3.HashToUInt64(tile));
    }

    /// <summary>True when the header and key match what a file of <paramref name="fileLength"/> bytes for this key must hold; gives the tile's length and hash.</summary>
    public static bool TryReadHeader(ReadOnlySpan<byte> headerAndKey, ReadOnlySpan<byte> key, long fileLength, out int tileLength, out ulong tileHash)
    {
        tileLength = 0;
        tileHash = 0;
        if (headerAndKey.Length != HeaderBytes + key.Length) return false;
        if (BinaryPrimitives.ReadUInt32LittleEndian(headerAndKey) != Magic) return false;
        if (BinaryPrimitives.ReadUInt32LittleEndian(headerAndKey[4..]) != Format) return false;
        if (BinaryPrimitives.ReadInt32LittleEndian(headerAndKey[8..]) != key.Length) return false;
        tileLength = BinaryPrimitives.ReadInt32LittleEndian(headerAndKey[12..]);
        tileHash = BinaryPrimitives.ReadUInt64LittleEndian(headerAndKey[16..]);
        if (tileLength < 0 || fileLength != HeaderBytes + (long)key.Length + tileLength) return false;
        return headerAndKey[HeaderBytes..].SequenceEqual(key);
    }

    public static bool HashMatches(ReadOnlySpan<byte> tile, ulong expected) => XxHash3.HashToUInt64(tile) == expected;

    private static bool IsLowerHex(ReadOnlySpan<char> text) => !text.ContainsAnyExcept(LowerHex);

    private static readonly SearchValues<char> LowerHex = SearchValues.Create("0123456789abcdef");
}
