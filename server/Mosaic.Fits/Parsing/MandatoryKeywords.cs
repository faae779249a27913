namespace Mosaic.Fits.Parsing;

/// <summary>Checks the mandatory keywords of an HDU, their order and values, and derives its layout (FITS 4.0 sections 4.4.1, 6 and 7).</summary>
internal static class MandatoryKeywords
{
    public static HduLayout Check(Header header, bool primary, in ParseContext context)
    {
        var cards = header.Cards;
        var position = 0;
        string? xtension = null;
        if (primary)
        {
            var simple = Expect(cards, position++, "SIMPLE", context);
            if (simple.Value is not bool conforms)
                throw context.Error("SIMPLE", "SIMPLE must have the logical value T (section 4.4.1.1)");
            if (!conforms)
                throw context.Error("SIMPLE", "SIMPLE = F: the file says it does not conform to the FITS standard");
        }
        else
        {
            var x = Expect(cards, position++, "XTENSION", context);
            if (x.Value is not string type || type.Trim().Length == 0)
                throw context.Error("XTENSION", "XTENSION must be a non-empty string naming the extension type (section 7)");
            xtension = type.Trim();
        }

        var bitPixValue = IntegerAt(cards, position++, "BITPIX", context, min: long.MinValue, max: long.MaxValue);
        if (bitPixValue is not (8 or 16 or 32 or 64 or -32 or -64))
            throw context.Error("BITPIX", $"unsupported BITPIX = {bitPixValue}; allowed are 8, 16, 32, 64, -32 and -64 (section 4.4.1.1, table 8)");
        var bitPix = (int)bitPixValue;

        var naxis = (int)IntegerAt(cards, position++, "NAXIS", context, min: 0, max: 999);
        var axes = new long[naxis];
        for (var n = 0; n < naxis; n++)
            axes[n] = IntegerAt(cards, position++, $"NAXIS{n + 1}", context, min: 0, max: long.MaxValue);

        long pCount = 0, gCount = 1;
        var randomGroups = false;
        if (!primary)
        {
            pCount = IntegerAt(cards, position++, "PCOUNT", context, min: 0, max: long.MaxValue);
            gCount = IntegerAt(cards, position++, "GCOUNT", context, min: 0, max: long.MaxValue);
        }
        else if (naxis >= 1 && axes[0] == 0 && header.GetBool("GROUPS") == true)
        {
            // Random groups (section 6): PCOUNT and GCOUNT say how many parameters and groups follow.
            randomGroups = true;
            pCount = OptionalInteger(header, "PCOUNT", 0, context);
            gCount = OptionalInteger(header, "GCOUNT", 1, context);
        }

        RejectRepeats(cards, position, primary, naxis, context);

        var holdsImage = primary ? !randomGroups : xtension == "IMAGE";
        if (xtension == "IMAGE" && (pCount != 0 || gCount != 1))
            throw context.Error(pCount != 0 ? "PCOUNT" : "GCOUNT", "an IMAGE extension must have PCOUNT = 0 and GCOUNT = 1 (section 7.1.1)");

        var dataLength = DataLength(bitPix, axes, pCount, gCount, randomGroups, context);
        return new HduLayout(bitPix, axes, pCount, gCount, dataLength, holdsImage);
    }

    /// <summary>Section 4.4.1.1 and 7.1: Nbits = |BITPIX| x GCOUNT x (PCOUNT + NAXIS1 x ... x NAXISn), in checked arithmetic.</summary>
    private static long DataLength(int bitPix, long[] axes, long pCount, long gCount, bool randomGroups, in ParseContext context)
    {
        if (axes.Length == 0 && pCount == 0) return 0;
        try
        {
            long product = axes.Length == 0 ? 0 : 1;
            for (var n = randomGroups ? 1 : 0; n < axes.Length; n++) product = checked(product * axes[n]);
            return checked(Math.Abs(bitPix) / 8 * gCount * (pCount + product));
        }
        catch (OverflowException)
        {
            throw context.Error("NAXIS", "the data size given by BITPIX, NAXISn, PCOUNT and GCOUNT overflows 64 bits");
        }
    }

    private static HeaderCard Expect(IReadOnlyList<HeaderCard> cards, int position, string keyword, in ParseContext context)
    {
        if (position < cards.Count && cards[position].Keyword == keyword) return cards[position];
        for (var i = 0; i < cards.Count; i++)
            if (cards[i].Keyword == keyword)
                throw context.Error(keyword,
                    $"mandatory keyword {keyword} is out of order: found as record {i + 1}, required as record {position + 1} (section 4.4.1)");
        throw context.Error(keyword, $"mandatory keyword {keyword} is missing (section 4.4.1)");
    }

    private static long IntegerAt(IReadOnlyList<HeaderCard> cards, int position, string keyword, in ParseContext context, long min, long max)
    {
        var card = Expect(cards, position, keyword, context);
        if (card.Value is not long value)
            throw context.Error(keyword, $"{keyword} must be an integer, not {Describe(card.Value)} (section 4.4.1)");
        if (value < min || value > max)
            throw context.Error(keyword, value < 0 && min == 0
                ? $"{keyword} = {value} is negative (section 4.4.1)"
                : $"{keyword} = {value} is outside {min}..{max} (section 4.4.1)");
        return value;
    }

    private static long OptionalInteger(Header header, string keyword, long fallback, in ParseContext context)
    {
        var card = header.Find(keyword);
        if (card is null) return fallback;
        if (card.Value is long v && v >= 0) return v;
        throw context.Error(keyword, $"{keyword} must be a non-negative integer (section 6)");
    }

    /// <summary>A mandatory keyword given a second time would leave the layout ambiguous.</summary>
    private static void RejectRepeats(IReadOnlyList<HeaderCard> cards, int firstOptional, bool primary, int naxis, in ParseContext context)
    {
        for (var i = firstOptional; i < cards.Count; i++)
        {
            var k = cards[i].Keyword;
            if (cards[i].IsCommentary) continue;
            var mandatory = k is "SIMPLE" or "XTENSION" or "BITPIX" or "NAXIS"
                || (!primary && k is "PCOUNT" or "GCOUNT")
                || (k.Length > 5 && k.StartsWith("NAXIS", StringComparison.Ordinal) && char.IsAsciiDigit(k[5])
                    && int.TryParse(k.AsSpan(5), System.Globalization.NumberStyles.None, null, out var n) && n >= 1 && n <= naxis);
            if (mandatory)
                throw context.Error(k, $"mandatory keyword {k} appears more than once (record {i + 1}; section 4.4.1)");
        }
    }

    private static string Describe(object? value) => value switch
    {
        null => "an undefined value",
        string s => $"the string '{s}'",
        bool b => b ? "T" : "F",
        System.Numerics.BigInteger b => $"{b} (beyond 64 bits)",
        _ => Convert.ToString(value, System.Globalization.CultureInfo.InvariantCulture) ?? "?",
    };
}
