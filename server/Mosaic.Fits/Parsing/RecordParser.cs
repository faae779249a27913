using System.Text;

namespace Mosaic.Fits.Parsing;

/// <summary>Splits one 80-character keyword record into keyword, value and comment (FITS 4.0 section 4.1.2).</summary>
internal static class RecordParser
{
    public const int RecordLength = 80;

    public static ParsedRecord Parse(ReadOnlySpan<char> record, in ParseContext context)
    {
        var keywordField = record[..8];
        var keyword = keywordField.TrimEnd(' ').ToString();
        ValidateKeywordField(keywordField, keyword, context);
        var rest = record[8..];

        switch (keyword)
        {
            case "END":
                if (!rest.IsWhiteSpace())
                    throw context.Error("END", "the END record must be blank in columns 9-80 (section 4.4.1)");
                return new ParsedRecord(RecordKind.End, "END", null, null, false);
            case "COMMENT" or "HISTORY" or "":
                return new ParsedRecord(RecordKind.Commentary, keyword, null, rest.TrimEnd(' ').ToString(), false);
            case "HIERARCH":
                return ParseHierarch(rest, context);
            case "CONTINUE":
                return ParseContinue(rest, context);
        }

        if (rest[0] != '=' || rest[1] != ' ')
            return new ParsedRecord(RecordKind.Commentary, keyword, null, rest.TrimEnd(' ').ToString(), false);

        var (value, comment) = ValueField.Parse(rest[2..], keyword, context);
        return WithContinuation(RecordKind.Value, keyword, value, comment);
    }

    /// <summary>Section 4.1.2.1: keyword characters are A-Z, 0-9, '_' and '-', left-justified. Lower case is tolerated (common practice).</summary>
    private static void ValidateKeywordField(ReadOnlySpan<char> field, string keyword, in ParseContext context)
    {
        for (var i = 0; i < field.Length; i++)
        {
            var c = field[i];
            if (c == ' ')
            {
                if (i < keyword.Length)
                    throw context.Error(keyword, "keyword field has an embedded space (section 4.1.2.1)");
                continue;
            }
            if (!(char.IsAsciiLetterOrDigit(c) || c is '_' or '-'))
                throw context.Error(keyword, $"keyword contains '{c}', which is not allowed in a keyword name (section 4.1.2.1)");
        }
    }

    /// <summary>
    /// The HIERARCH convention: "HIERARCH word word ... = value". Stored under the words after HIERARCH, joined by single
    /// spaces. Without '=' the record is commentary.
    /// </summary>
    private static ParsedRecord ParseHierarch(ReadOnlySpan<char> rest, in ParseContext context)
    {
        var eq = rest.IndexOf('=');
        var quote = rest.IndexOf('\'');
        if (eq < 0 || (quote >= 0 && quote < eq))
            return new ParsedRecord(RecordKind.Commentary, "HIERARCH", null, rest.TrimEnd(' ').ToString(), false);
        var name = CollapseSpaces(rest[..eq]);
        if (name.Length == 0) throw context.Error("HIERARCH", "HIERARCH record has no keyword words before '='");
        var (value, comment) = ValueField.Parse(rest[(eq + 1)..], name, context);
        return WithContinuation(RecordKind.Value, name, value, comment);
    }

    /// <summary>Section 4.2.1.2: "CONTINUE" then spaces in columns 9-10, then a string. Anything else is commentary.</summary>
    private static ParsedRecord ParseContinue(ReadOnlySpan<char> rest, in ParseContext context)
    {
        if (rest[..2] is "  " && rest[2..].TrimStart(' ') is ['\'', ..])
        {
            var (value, comment) = ValueField.Parse(rest[2..], "CONTINUE", context);
            if (value is string)
                return WithContinuation(RecordKind.Continue, "CONTINUE", value, comment);
        }
        return new ParsedRecord(RecordKind.Commentary, "CONTINUE", null, rest.TrimEnd(' ').ToString(), false);
    }

    private static ParsedRecord WithContinuation(RecordKind kind, string keyword, object? value, string? comment)
    {
        if (value is string s && s.EndsWith('&'))
            return new ParsedRecord(kind, keyword, s[..^1], comment, true);
        return new ParsedRecord(kind, keyword, value, comment, false);
    }

    private static string CollapseSpaces(ReadOnlySpan<char> words)
    {
        var sb = new StringBuilder(words.Length);
        foreach (var range in words.Trim(' ').Split(' '))
        {
            var word = words.Trim(' ')[range];
            if (word.IsEmpty) continue;
            if (sb.Length > 0) sb.Append(' ');
            sb.Append(word);
        }
        return sb.ToString();
    }
}
