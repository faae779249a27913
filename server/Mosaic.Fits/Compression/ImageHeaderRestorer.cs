namespace Mosaic.Fits.Compression;

/// <summary>
/// The header of the image a compressed table stands for (FITS 4.0 section 10.1.1, table 35): the table's own
/// structure keywords and the compression keywords dropped, the saved originals (ZSIMPLE, ZTENSION, ZBITPIX,
/// ZNAXISn, ZPCOUNT, ZGCOUNT, ZEXTEND, ZBLOCKED, ZHECKSUM, ZDATASUM) put back under their own names.
/// </summary>
internal static class ImageHeaderRestorer
{
    private static readonly HashSet<string> Dropped = new(StringComparer.Ordinal)
    {
        "XTENSION", "BITPIX", "NAXIS", "PCOUNT", "GCOUNT", "TFIELDS", "THEAP", "CHECKSUM", "DATASUM",
        "ZIMAGE", "ZCMPTYPE", "ZBITPIX", "ZNAXIS", "ZMASKCMP", "ZQUANTIZ", "ZDITHER0", "ZSIMPLE", "ZTENSION",
        "ZEXTEND", "ZPCOUNT", "ZGCOUNT", "ZBLANK", "ZSCALE", "ZZERO",
    };

    private static readonly string[] DroppedPrefixes =
        ["NAXIS", "TTYPE", "TFORM", "TUNIT", "TSCAL", "TZERO", "TNULL", "TDISP", "TDIM", "ZNAXIS", "ZTILE", "ZNAME", "ZVAL"];

    private static readonly Dictionary<string, string> Renamed = new(StringComparer.Ordinal)
    {
        ["ZHECKSUM"] = "CHECKSUM",
        ["ZDATASUM"] = "DATASUM",
        ["ZBLOCKED"] = "BLOCKED",
    };

    public static Header Restore(Header table, CompressedImageLayout layout)
    {
        var cards = new List<HeaderCard>(table.Cards.Count);
        var primary = table.Contains("ZSIMPLE");
        if (primary) cards.Add(new HeaderCard("SIMPLE", table.Find("ZSIMPLE")!.Value, "conforms to FITS standard"));
        else cards.Add(new HeaderCard("XTENSION", table.GetString("ZTENSION")?.TrimEnd() ?? "IMAGE", "image extension"));
        cards.Add(new HeaderCard("BITPIX", (long)layout.ZBitPix, "array data type"));
        cards.Add(new HeaderCard("NAXIS", (long)layout.Axes.Length, "number of array dimensions"));
        for (var n = 0; n < layout.Axes.Length; n++) cards.Add(new HeaderCard($"NAXIS{n + 1}", layout.Axes[n], null));
        if (primary)
        {
            if (table.Find("ZEXTEND") is { } extend) cards.Add(new HeaderCard("EXTEND", extend.Value, extend.Comment));
        }
        else
        {
            cards.Add(new HeaderCard("PCOUNT", table.GetLong("ZPCOUNT") ?? 0L, "number of parameters"));
            cards.Add(new HeaderCard("GCOUNT", table.GetLong("ZGCOUNT") ?? 1L, "number of groups"));
        }

        foreach (var card in table.Cards)
        {
            if (card.IsCommentary) { cards.Add(card); continue; }
            var k = card.Keyword;
            if (Dropped.Contains(k) || DroppedPrefixes.Any(p => IsIndexed(k, p))) continue;
            // The writer's name for the table of a compressed primary array, not the image's own name (common practice).
            if (k == "EXTNAME" && card.Value is string name && name.Trim() == "COMPRESSED_IMAGE") continue;
            cards.Add(Renamed.TryGetValue(k, out var original) ? card with { Keyword = original } : card);
        }

        // An integer image's undefined value may be carried as ZBLANK only (section 10.1.1).
        if (layout.ZBitPix > 0 && !table.Contains("BLANK") && table.Find("ZBLANK") is { Value: long blank })
            cards.Add(new HeaderCard("BLANK", blank, "value of undefined pixels"));
        return new Header(cards);
    }

    private static bool IsIndexed(string keyword, string prefix) =>
        keyword.Length > prefix.Length && keyword.StartsWith(prefix, StringComparison.Ordinal)
        && keyword.AsSpan(prefix.Length).IndexOfAnyExceptInRange('0', '9') < 0;
}
