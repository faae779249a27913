using Microsoft.Win32.SafeHandles;

namespace Mosaic.Fits.Parsing;

/// <summary>Reads one header from its first block to END, straight from the file handle.</summary>
internal static class HeaderReader
{
    public const int BlockSize = 2880;

    /// <summary>Headers beyond this many blocks (2.88 MB) are refused rather than read without end.</summary>
    public const int MaxBlocks = 1000;

    private const int RecordsPerBlock = BlockSize / RecordParser.RecordLength;

    /// <summary>The header starting at <paramref name="offset"/> and its length in bytes (whole blocks).</summary>
    public static (Header Header, long Length) Read(SafeFileHandle handle, long offset, long fileLength, in ParseContext context)
    {
        var builder = new HeaderBuilder();
        Span<byte> block = stackalloc byte[BlockSize];
        Span<char> chars = stackalloc char[RecordParser.RecordLength];
        for (var b = 0; b < MaxBlocks; b++)
        {
            var blockOffset = offset + (long)b * BlockSize;
            if (fileLength - blockOffset < BlockSize)
                throw context.Error("END", fileLength - blockOffset <= 0
                    ? "the header has no END record before the end of the file (truncated header or missing END)"
                    : $"truncated header: the file ends {fileLength - blockOffset} bytes into a 2880-byte header block, before END");
            ReadExactly(handle, block, blockOffset, context);

            for (var r = 0; r < RecordsPerBlock; r++)
            {
                var bytes = block.Slice(r * RecordParser.RecordLength, RecordParser.RecordLength);
                ToChars(bytes, chars, builder.Count, context);
                var record = RecordParser.Parse(chars, context);
                if (record.Kind == RecordKind.End)
                {
                    var after = block[((r + 1) * RecordParser.RecordLength)..];
                    if (after.IndexOfAnyExcept((byte)' ') >= 0)
                        throw context.Error("END", "the rest of the last header block after END must be spaces (section 4.4.1)");
                    return (builder.Build(), (long)(b + 1) * BlockSize);
                }
                builder.Add(record);
            }
        }
        throw context.Error("END", $"the header has no END within {MaxBlocks} blocks ({MaxBlocks * (long)BlockSize} bytes); refusing a header this large");
    }

    /// <summary>Section 4.1.1: header bytes are restricted to printable ASCII 0x20-0x7E.</summary>
    private static void ToChars(ReadOnlySpan<byte> bytes, Span<char> chars, int cardIndex, in ParseContext context)
    {
        var bad = bytes.IndexOfAnyExceptInRange((byte)0x20, (byte)0x7E);
        if (bad >= 0)
        {
            var keyword = KeywordOf(bytes);
            throw context.Error(keyword,
                $"header record {cardIndex + 1} has byte 0x{bytes[bad]:X2} at column {bad + 1}; only printable ASCII 0x20-0x7E is allowed (section 4.1.1)");
        }
        for (var i = 0; i < bytes.Length; i++) chars[i] = (char)bytes[i];
    }

    private static string? KeywordOf(ReadOnlySpan<byte> record)
    {
        Span<char> k = stackalloc char[8];
        var n = 0;
        foreach (var b in record[..8])
        {
            if (b is < 0x21 or > 0x7E) break;
            k[n++] = (char)b;
        }
        return n == 0 ? null : new string(k[..n]);
    }

    private static void ReadExactly(SafeFileHandle handle, Span<byte> buffer, long offset, in ParseContext context)
    {
        var done = 0;
        while (done < buffer.Length)
        {
            var n = RandomAccess.Read(handle, buffer[done..], offset + done);
            if (n == 0) throw context.Error("END", "truncated header: the file ended while reading a header block");
            done += n;
        }
    }
}
