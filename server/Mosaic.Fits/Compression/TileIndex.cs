using System.Buffers.Binary;
using Microsoft.Win32.SafeHandles;
using Mosaic.Fits.Parsing;

namespace Mosaic.Fits.Compression;

/// <summary>Reads the table rows of the first image plane's tiles at open, checking every heap descriptor against the heap.</summary>
internal static class TileIndex
{
    public static TileEntry[] Read(SafeFileHandle handle, long dataOffset, CompressedImageLayout layout, in ParseContext context)
    {
        var count = (long)layout.TilesX * layout.TilesY;
        if (count > int.MaxValue / 2) throw context.Error("ZTILE1", $"{count} tiles in one plane are more than this reader indexes");
        var entries = new TileEntry[count];
        var rowBytes = (int)Math.Min(layout.RowBytes, int.MaxValue);
        if (layout.RowBytes > 1 << 20) throw context.Error("NAXIS1", $"NAXIS1 = {layout.RowBytes} bytes per row is far more than a compressed image table needs");

        const int RowsPerRead = 4096;
        var buffer = new byte[Math.Max(1, rowBytes) * (int)Math.Min(RowsPerRead, count)];
        for (long first = 0; first < count; first += RowsPerRead)
        {
            var rows = (int)Math.Min(RowsPerRead, count - first);
            var span = buffer.AsSpan(0, rows * rowBytes);
            ReadExactly(handle, span, dataOffset + first * rowBytes, context);
            for (var r = 0; r < rows; r++)
            {
                var row = span.Slice(r * rowBytes, rowBytes);
                var index = first + r;
                entries[index] = new TileEntry(
                    index,
                    Span(row, layout.CompressedData, layout, dataOffset, index, context),
                    Span(row, layout.GzipData, layout, dataOffset, index, context),
                    Span(row, layout.UncompressedData, layout, dataOffset, index, context),
                    layout.ScaleColumn is { } s ? Number(row, s) : layout.ScaleKeyword ?? 1.0,
                    layout.ZeroColumn is { } z ? Number(row, z) : layout.ZeroKeyword ?? 0.0,
                    layout.NullColumn is { } n ? WholeNumber(row, n) : layout.NullValue);
            }
        }
        return entries;
    }

    /// <summary>A P (two 32-bit) or Q (two 64-bit) descriptor: element count, then byte offset into the heap (section 7.3.5).</summary>
    private static HeapSpan Span(ReadOnlySpan<byte> row, TableColumn? column, CompressedImageLayout layout, long dataOffset, long index, in ParseContext context)
    {
        if (column is null) return default;
        var field = row.Slice((int)column.Offset, (int)column.Width);
        long elements, offset;
        if (column.Descriptor == 32)
        {
            elements = BinaryPrimitives.ReadInt32BigEndian(field);
            offset = BinaryPrimitives.ReadInt32BigEndian(field[4..]);
        }
        else
        {
            elements = BinaryPrimitives.ReadInt64BigEndian(field);
            offset = BinaryPrimitives.ReadInt64BigEndian(field[8..]);
        }
        var keyword = $"TFORM{column.Number}";
        if (elements < 0 || offset < 0)
            throw context.Error(keyword, $"tile {index + 1}: the {column.Name} descriptor has a negative count or offset ({elements}, {offset}; section 7.3.5)");
        if (elements == 0) return default;
        var size = column.ElementBytes;
        if (size == 0) throw context.Error(keyword, $"the {column.Name} column's element type '{column.Type}' cannot hold tile data");
        if (elements > layout.HeapLength / size || offset > layout.HeapLength - elements * size)
            throw context.Error(keyword,
                $"tile {index + 1}: the {column.Name} descriptor ({elements} x {size} bytes at heap offset {offset}) runs outside the heap of {layout.HeapLength} bytes (section 7.3.5)");
        return new HeapSpan(dataOffset + layout.HeapStart + offset, elements * size);
    }

    private static double Number(ReadOnlySpan<byte> row, TableColumn column)
    {
        var f = row[(int)column.Offset..];
        return column.Type switch
        {
            'B' => f[0],
            'I' => BinaryPrimitives.ReadInt16BigEndian(f),
            'J' => BinaryPrimitives.ReadInt32BigEndian(f),
            'K' => BinaryPrimitives.ReadInt64BigEndian(f),
            'E' => BinaryPrimitives.ReadSingleBigEndian(f),
            _ => BinaryPrimitives.ReadDoubleBigEndian(f),
        };
    }

    private static long WholeNumber(ReadOnlySpan<byte> row, TableColumn column)
    {
        var f = row[(int)column.Offset..];
        return column.Type switch
        {
            'B' => f[0],
            'I' => BinaryPrimitives.ReadInt16BigEndian(f),
            'J' => BinaryPrimitives.ReadInt32BigEndian(f),
            _ => BinaryPrimitives.ReadInt64BigEndian(f),
        };
    }

    internal static void ReadExactly(SafeFileHandle handle, Span<byte> buffer, long offset, in ParseContext context)
    {
        var done = 0;
        while (done < buffer.Length)
        {
            var n = RandomAccess.Read(handle, buffer[done..], offset + done);
            if (n == 0) throw context.Error(null, $"truncated data: the file ends before byte {offset + buffer.Length}");
            done += n;
        }
    }
}
