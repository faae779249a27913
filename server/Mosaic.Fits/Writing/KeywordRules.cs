namespace Mosaic.Fits.Writing;

/// <summary>What the writer accepts as a keyword and as text, per FITS 4.0 sections 4.1.2.1 and 4.1.1.</summary>
internal static class KeywordRules
{
    public static bool IsCommentaryKeyword(string keyword) => keyword is "COMMENT" or "HISTORY" or "";

    /// <summary>Keywords the writer puts itself; a caller card with one of these would contradict the data.</summary>
    public static bool IsWriterOwned(string keyword)
    {
        if (keyword is "SIMPLE" or "XTENSION" or "BITPIX" or "NAXIS" or "EXTEND" or "PCOUNT" or "GCOUNT" or "END"
            or "CONTINUE" or "GROUPS")
            return true;
        if (keyword.Length > 5 && keyword.StartsWith("NAXIS", StringComparison.Ordinal))
        {
            foreach (var c in keyword.AsSpan(5))
                if (c is < '0' or > '9') return false;
            return true;
        }
        return false;
    }

    public static void ValidateKeyword(string keyword)
    {
        ArgumentNullException.ThrowIfNull(keyword);
        if (keyword.Length > 8)
            throw new ArgumentException($"Keyword '{keyword}' is longer than 8 characters (FITS 4.0 section 4.1.2.1).", nameof(keyword));
        foreach (var c in keyword)
            if (c is not ((>= 'A' and <= 'Z') or (>= '0' and <= '9') or '_' or '-'))
                throw new ArgumentException($"Keyword '{keyword}' may contain only A-Z, 0-9, '_' and '-' (FITS 4.0 section 4.1.2.1).", nameof(keyword));
    }

    public static void ValidateText(string keyword, string text, string what)
    {
        foreach (var c in text)
            if (c is < ' ' or > '~')
                throw new ArgumentException(
                    $"The {what} of keyword '{keyword}' contains a character outside printable ASCII 0x20-0x7E (FITS 4.0 section 4.1.1): U+{(int)c:X4}.",
                    nameof(text));
    }
}
