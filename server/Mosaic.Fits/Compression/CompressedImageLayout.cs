using Mosaic.Fits.Parsing;

namespace Mosaic.Fits.Compression;

/// <summary>
/// The keywords of a tile-compressed image (FITS 4.0 section 10.1): the image's size and type, the tiling, the codec
/// and its parameters, the quantisation, and the columns of the table that hold each tile.
/// </summary>
internal sealed class CompressedImageLayout
{
    /// <summary>Larger tiles are refused: a crafted ZTILEn must not make one decode allocate without bound.</summary>
    public const long MaxTilePixels = 1L << 24;

    public required int ZBitPix { get; init; }
    public required long[] Axes { get; init; }
    public required long[] Tile { get; init; }
    public required TileCodec Codec { get; init; }
    public required string CodecName { get; init; }
    public required int BlockSize { get; init; }
    public required int BytePix { get; init; }
    public required QuantizeMethod Quantize { get; init; }
    public required int DitherSeed { get; init; }
    public required long? NullValue { get; init; }
    public required double? ScaleKeyword { get; init; }
    public required double? ZeroKeyword { get; init; }
    public required TableColumn? CompressedData { get; init; }
    public required TableColumn? GzipData { get; init; }
    public required TableColumn? UncompressedData { get; init; }
    public required TableColumn? ScaleColumn { get; init; }
    public required TableColumn? ZeroColumn { get; init; }
    public required TableColumn? NullColumn { get; init; }
    public required long RowBytes { get; init; }
    public required long Rows { get; init; }
    /// <summary>Heap start and length, relative to the start of the table's data.</summary>
    public required long HeapStart { get; init; }
    public required long HeapLength { get; init; }

    public int Width => (int)Axes[0];
    public int Height => (int)Axes[1];
    public int TileWidth => (int)Math.Min(Tile[0], Axes[0]);
    public int TileHeight => (int)Math.Min(Tile[1], Axes[1]);
    public int TilesX => (int)((Axes[0] + Tile[0] - 1) / Tile[0]);
    public int TilesY => (int)((Axes[1] + Tile[1] - 1) / Tile[1]);

    /// <summary>Floating-point image whose tiles hold quantised integers rather than the values.</summary>
    public bool IsQuantized => ZBitPix < 0 && Quantize != QuantizeMethod.Lossless;

    /// <summary>Planes beyond the first that each tile also holds (tiles deeper than one along axes 3 and up).</summary>
    public long PlanesPerTile { get; init; } = 1;

    /// <summary>The layout of a BINTABLE with ZIMAGE = T, or null where the table holds no 2-D image (ZNAXIS &lt; 2, or an empty axis).</summary>
    public static CompressedImageLayout? Parse(Header header, HduLayout table, in ParseContext context)
    {
        if (table.Axes.Length != 2 || table.BitPix != 8)
            throw context.Error("NAXIS", "a tile-compressed image must be a binary table with BITPIX = 8 and NAXIS = 2 (sections 7.3.1 and 10.1)");
        var rowBytes = table.Axes[0];
        var rows = table.Axes[1];

        var zBitPix = Integer(header, "ZBITPIX", context);
        if (zBitPix is not (8 or 16 or 32 or 64 or -32 or -64))
            throw context.Error("ZBITPIX", $"ZBITPIX = {zBitPix} is not one of 8, 16, 32, 64, -32, -64 (section 10.1.1)");
        var zNaxis = Integer(header, "ZNAXIS", context);
        if (zNaxis < 0 || zNaxis > 999) throw context.Error("ZNAXIS", $"ZNAXIS = {zNaxis} is outside 0..999 (section 10.1.1)");
        if (zNaxis < 2) return null;

        var axes = new long[zNaxis];
        var tile = new long[zNaxis];
        for (var n = 0; n < zNaxis; n++)
        {
            axes[n] = Integer(header, $"ZNAXIS{n + 1}", context);
            if (axes[n] < 0) throw context.Error($"ZNAXIS{n + 1}", $"ZNAXIS{n + 1} = {axes[n]} is negative (section 10.1.1)");
        }
        if (axes.Any(a => a == 0)) return null;
        if (axes[0] > int.MaxValue) throw context.Error("ZNAXIS1", $"ZNAXIS1 = {axes[0]} is wider than this reader serves ({int.MaxValue} columns)");
        if (axes[1] > int.MaxValue) throw context.Error("ZNAXIS2", $"ZNAXIS2 = {axes[1]} is taller than this reader serves ({int.MaxValue} rows)");
        for (var n = 0; n < zNaxis; n++)
        {
            var keyword = $"ZTILE{n + 1}";
            // Section 10.1.1: without ZTILEn the tiles are whole rows.
            tile[n] = header.Contains(keyword) ? Integer(header, keyword, context) : n == 0 ? axes[0] : 1;
            if (tile[n] < 1) throw context.Error(keyword, $"{keyword} = {tile[n]} must be at least 1 (section 10.1.1)");
        }

        long tileCount = 1, tilePixels = 1, planesPerTile = 1;
        try
        {
            for (var n = 0; n < zNaxis; n++)
            {
                tileCount = checked(tileCount * ((axes[n] + tile[n] - 1) / tile[n]));
                var clipped = Math.Min(tile[n], axes[n]);
                tilePixels = checked(tilePixels * clipped);
                if (n >= 2) planesPerTile = checked(planesPerTile * clipped);
            }
        }
        catch (OverflowException)
        {
            throw context.Error("ZTILE1", "the number or size of the tiles given by ZNAXISn and ZTILEn overflows 64 bits");
        }
        if (tilePixels > MaxTilePixels)
            throw context.Error("ZTILE1", $"a tile of {string.Join(" x ", tile.Select((t, n) => Math.Min(t, axes[n])))} pixels is larger than this reader decodes ({MaxTilePixels} pixels)");
        if (tileCount != rows)
            throw context.Error("ZTILE1",
                $"ZNAXISn and ZTILEn make {tileCount} tiles, but the table has NAXIS2 = {rows} rows, one per tile (section 10.1)");

        var codecName = header.GetString("ZCMPTYPE")?.Trim()
            ?? throw context.Error("ZCMPTYPE", "a tile-compressed image needs ZCMPTYPE (section 10.1.1)");
        var codec = codecName switch
        {
            "RICE_1" or "RICE_ONE" => TileCodec.Rice,
            "GZIP_1" => TileCodec.Gzip1,
            "GZIP_2" => TileCodec.Gzip2,
            "NOCOMPRESS" => TileCodec.NoCompress,
            "PLIO_1" => TileCodec.Plio,
            "HCOMPRESS_1" => TileCodec.HCompress,
            _ => throw context.Error("ZCMPTYPE",
                $"unknown ZCMPTYPE = '{codecName}'; known are RICE_1, GZIP_1, GZIP_2, PLIO_1, HCOMPRESS_1 and NOCOMPRESS (section 10.4)"),
        };

        var (blockSize, bytePix) = RiceParameters(header, zBitPix, context);

        var columns = TableColumns.Parse(header, rowBytes, context);
        TableColumn? Column(string name) => columns.FirstOrDefault(c => string.Equals(c.Name, name, StringComparison.OrdinalIgnoreCase));
        var compressed = Descriptor(Column("COMPRESSED_DATA"), context);
        var gzip = Descriptor(Column("GZIP_COMPRESSED_DATA"), context);
        var uncompressed = Descriptor(Column("UNCOMPRESSED_DATA"), context);
        if (compressed is null && gzip is null && uncompressed is null)
            throw context.Error("TTYPE1", "the table has no COMPRESSED_DATA, GZIP_COMPRESSED_DATA or UNCOMPRESSED_DATA column (section 10.1.2)");
        var scale = Scalar(Column("ZSCALE"), context);
        var zero = Scalar(Column("ZZERO"), context);
        var nullColumn = Scalar(Column("ZBLANK"), context);
        if (nullColumn is not null && nullColumn.Type is not ('B' or 'I' or 'J' or 'K'))
            throw context.Error($"TFORM{nullColumn.Number}", "the ZBLANK column must hold integers (section 10.1.2)");

        var scaleKeyword = header.Contains("ZSCALE") ? Real(header, "ZSCALE", context) : (double?)null;
        var zeroKeyword = header.Contains("ZZERO") ? Real(header, "ZZERO", context) : (double?)null;
        var hasScale = scale is not null || scaleKeyword is not null;
        var hasZero = zero is not null || zeroKeyword is not null;
        if (hasScale != hasZero)
            throw context.Error(hasScale ? "ZZERO" : "ZSCALE", "ZSCALE and ZZERO come together: one is given without the other (section 10.2)");

        var quantize = QuantizeOf(header, zBitPix, hasScale, context);
        var seed = 1;
        if (quantize is QuantizeMethod.SubtractiveDither1 or QuantizeMethod.SubtractiveDither2 && header.Contains("ZDITHER0"))
        {
            var d = Integer(header, "ZDITHER0", context);
            if (d < 1 || d > DitherSequence.Length)
                throw context.Error("ZDITHER0", $"ZDITHER0 = {d} is outside 1..{DitherSequence.Length} (section 10.2.1)");
            seed = (int)d;
        }
        // Without ZDITHER0 the sequence starts at its first value: files written before the keyword existed assume
        // this (from memory of the reference library's reading rule).

        long? nullValue = null;
        if (header.Contains("ZBLANK")) nullValue = Integer(header, "ZBLANK", context);
        else if (zBitPix > 0 && header.Contains("BLANK")) nullValue = Integer(header, "BLANK", context);

        if (codec == TileCodec.Rice && zBitPix < 0 && quantize == QuantizeMethod.Lossless)
            throw context.Error("ZCMPTYPE", "RICE_1 compresses integers: a floating-point image needs ZSCALE and ZZERO to be quantised (section 10.4.1)");

        var heapStart = header.Contains("THEAP") ? Integer(header, "THEAP", context) : rowBytes * rows;
        var tableBytes = rowBytes * rows;
        if (heapStart < tableBytes || heapStart > tableBytes + table.PCount)
            throw context.Error("THEAP", $"THEAP = {heapStart} puts the heap outside the data after the table ({tableBytes}..{tableBytes + table.PCount} bytes; section 7.3.5)");

        return new CompressedImageLayout
        {
            ZBitPix = (int)zBitPix, Axes = axes, Tile = tile, Codec = codec, CodecName = codecName,
            BlockSize = blockSize, BytePix = bytePix, Quantize = quantize, DitherSeed = seed, NullValue = nullValue,
            ScaleKeyword = scaleKeyword, ZeroKeyword = zeroKeyword,
            CompressedData = compressed, GzipData = gzip, UncompressedData = uncompressed,
            ScaleColumn = scale, ZeroColumn = zero, NullColumn = nullColumn,
            RowBytes = rowBytes, Rows = rows, HeapStart = heapStart, HeapLength = tableBytes + table.PCount - heapStart,
            PlanesPerTile = planesPerTile,
        };
    }

    /// <summary>ZNAMEi / ZVALi pairs (section 10.1.1): BLOCKSIZE and BYTEPIX of RICE_1 (section 10.4.1); others are not needed to decode.</summary>
    private static (int BlockSize, int BytePix) RiceParameters(Header header, long zBitPix, in ParseContext context)
    {
        // Section 10.4.1: BLOCKSIZE defaults to 32 and BYTEPIX to 4.
        long blockSize = 32, bytePix = 4;
        for (var i = 1; i <= 999; i++)
        {
            var name = header.GetString($"ZNAME{i}")?.Trim();
            if (name is null) break;
            var keyword = $"ZVAL{i}";
            if (name.Equals("BLOCKSIZE", StringComparison.OrdinalIgnoreCase)) blockSize = Integer(header, keyword, context);
            else if (name.Equals("BYTEPIX", StringComparison.OrdinalIgnoreCase)) bytePix = Integer(header, keyword, context);
        }
        if (blockSize < 1 || blockSize > 1 << 20)
            throw context.Error("ZVAL1", $"the RICE_1 BLOCKSIZE = {blockSize} must be a positive pixel count (section 10.4.1)");
        if (bytePix is not (1 or 2 or 4 or 8))
            throw context.Error("ZVAL2", $"the RICE_1 BYTEPIX = {bytePix} must be 1, 2, 4 or 8 (section 10.4.1)");
        return ((int)blockSize, (int)bytePix);
    }

    private static QuantizeMethod QuantizeOf(Header header, long zBitPix, bool hasScale, in ParseContext context)
    {
        var text = header.GetString("ZQUANTIZ")?.Trim();
        if (text is null)
        {
            if (header.Contains("ZQUANTIZ")) throw context.Error("ZQUANTIZ", "ZQUANTIZ must be a string (section 10.2)");
            // Section 10.2: without ZQUANTIZ a quantised image was scaled without dithering.
            return zBitPix < 0 && hasScale ? QuantizeMethod.NoDither : QuantizeMethod.Lossless;
        }
        var method = text.ToUpperInvariant() switch
        {
            "NO_DITHER" => QuantizeMethod.NoDither,
            "SUBTRACTIVE_DITHER_1" => QuantizeMethod.SubtractiveDither1,
            "SUBTRACTIVE_DITHER_2" => QuantizeMethod.SubtractiveDither2,
            // Written for floating-point images compressed losslessly (common practice).
            "NONE" => QuantizeMethod.Lossless,
            _ => throw context.Error("ZQUANTIZ",
                $"unknown ZQUANTIZ = '{text}'; known are NO_DITHER, SUBTRACTIVE_DITHER_1 and SUBTRACTIVE_DITHER_2 (section 10.2)"),
        };
        // Integer images are never quantised; a ZQUANTIZ there (some writers add one) says nothing.
        if (zBitPix > 0) return QuantizeMethod.Lossless;
        if (method != QuantizeMethod.Lossless && !hasScale)
            throw context.Error("ZQUANTIZ", $"ZQUANTIZ = '{text}' but there is no ZSCALE column or keyword to undo the quantisation (section 10.2)");
        return hasScale ? method : QuantizeMethod.Lossless;
    }

    private static TableColumn? Descriptor(TableColumn? column, in ParseContext context)
    {
        if (column is null) return null;
        if (column.Descriptor == 0)
            throw context.Error($"TFORM{column.Number}", $"the {column.Name} column must be a variable-length array, 1P or 1Q (section 10.1.2)");
        return column;
    }

    private static TableColumn? Scalar(TableColumn? column, in ParseContext context)
    {
        if (column is null) return null;
        if (column.Descriptor != 0 || column.Repeat != 1 || column.Type is not ('B' or 'I' or 'J' or 'K' or 'E' or 'D'))
            throw context.Error($"TFORM{column.Number}", $"the {column.Name} column must hold one number per row (section 10.1.2)");
        return column;
    }

    private static long Integer(Header header, string keyword, in ParseContext context)
    {
        var card = header.Find(keyword) ?? throw context.Error(keyword, $"{keyword} is missing (section 10.1.1)");
        return card.Value is long v ? v : throw context.Error(keyword, $"{keyword} must be an integer (section 10.1.1)");
    }

    private static double Real(Header header, string keyword, in ParseContext context)
    {
        var d = header.GetDouble(keyword);
        return d is double v && double.IsFinite(v) ? v : throw context.Error(keyword, $"{keyword} must be a finite number (section 10.2)");
    }
}
