using System.Globalization;
using System.Numerics;
using System.Text;

namespace Mosaic.Fits.Writing;

/// <summary>Turns a <see cref="HeaderCard"/> into one or more 80-character records in the fixed format of FITS 4.0 section 4.2.</summary>
internal static class CardFormatter
{
    public const int CardLength = 80;
    private const int ValueColumn = 10;              // 0-based index of column 11
    private const int FixedValueWidth = 20;          // columns 11-30
    private const int MaxQuotedContent = 68;         // columns 12-79 inside the quotes
    private const int MaxCommentaryText = 72;        // columns 9-80

    /// <summary>Appends the card images (80 characters each, no separators) for one card.</summary>
    public static void Append(StringBuilder sb, HeaderCard card)
    {
        ArgumentNullException.ThrowIfNull(card);
        var keyword = card.Keyword;
        KeywordRules.ValidateKeyword(keyword);
        if (card.Comment is not null) KeywordRules.ValidateText(keyword, card.Comment, "comment");

        if (keyword == "HIERARCH")
            throw new ArgumentException("FitsWriter writes standard 8-character keywords only, not HIERARCH cards.", nameof(card));

        if (card.Value is null && (card.NoValueIndicator || KeywordRules.IsCommentaryKeyword(keyword)))
        {
            // Text starting "= " in columns 9-10 would turn the record into a value card (section 4.1.2.2).
            if (!KeywordRules.IsCommentaryKeyword(keyword) && (card.Comment ?? "").StartsWith("= ", StringComparison.Ordinal))
                throw new ArgumentException($"Commentary text of keyword '{keyword}' cannot start with \"= \" (it would read as a value).", nameof(card));
            AppendCommentary(sb, keyword, card.Comment ?? "");
            return;
        }

        if (card.Value is string s)
        {
            KeywordRules.ValidateText(keyword, s, "value");
            AppendString(sb, keyword, s, card.Comment);
            return;
        }

        var (text, rightJustify) = FormatNonString(keyword, card.Value);
        var field = rightJustify && text.Length <= FixedValueWidth ? text.PadLeft(FixedValueWidth) : text;
        var line = keyword.PadRight(8) + "= " + field;
        if (card.Comment is { } comment) line += " / " + comment;
        if (line.Length > CardLength)
            throw new ArgumentException(
                $"Card '{keyword}' needs {line.Length} characters with its comment; a card holds {CardLength}. Shorten the comment.",
                nameof(card));
        sb.Append(line.PadRight(CardLength));
    }

    private static void AppendCommentary(StringBuilder sb, string keyword, string text)
    {
        var prefix = keyword.PadRight(8);
        text = text.TrimEnd();
        if (text.Length == 0)
        {
            sb.Append(prefix.PadRight(CardLength));
            return;
        }
        // Long commentary is split over several cards of the same keyword (common practice).
        for (var start = 0; start < text.Length; start += MaxCommentaryText)
        {
            var piece = text.Substring(start, Math.Min(MaxCommentaryText, text.Length - start));
            sb.Append((prefix + piece).PadRight(CardLength));
        }
    }

    private static (string Text, bool RightJustify) FormatNonString(string keyword, object? value) => value switch
    {
        null => ("", false),
        bool b => (b ? "T" : "F", true),
        sbyte or byte or short or ushort or int or uint or long or ulong =>
            (Convert.ToString(value, CultureInfo.InvariantCulture)!, true),
        BigInteger big => (big.ToString(CultureInfo.InvariantCulture), true),
        float f => (FormatReal(keyword, f, f.ToString("R", CultureInfo.InvariantCulture)), true),
        double d => (FormatReal(keyword, d, d.ToString("R", CultureInfo.InvariantCulture)), true),
        decimal m => (FormatReal(keyword, (double)m, m.ToString(CultureInfo.InvariantCulture)), true),
        Complex c => ("(" + FormatReal(keyword, c.Real, c.Real.ToString("R", CultureInfo.InvariantCulture)) + ", "
                      + FormatReal(keyword, c.Imaginary, c.Imaginary.ToString("R", CultureInfo.InvariantCulture)) + ")", true),
        _ => throw new ArgumentException(
            $"Keyword '{keyword}': a value of type {value.GetType().Name} cannot be written; use string, bool, an integer type, BigInteger, float, double or Complex.",
            nameof(value)),
    };

    /// <summary>Shortest round-trip digits, always with a decimal point and an upper-case E exponent (section 4.2.4).</summary>
    private static string FormatReal(string keyword, double value, string roundTrip)
    {
        if (!double.IsFinite(value))
            throw new ArgumentException($"Keyword '{keyword}': {value} cannot be written; FITS header reals must be finite (section 4.2.4).", nameof(value));
        var text = roundTrip;
        var e = text.IndexOfAny(['E', 'e']);
        var mantissa = e < 0 ? text : text[..e];
        var exponent = e < 0 ? "" : "E" + text[(e + 1)..];
        if (!mantissa.Contains('.')) mantissa += ".0";
        return mantissa + exponent;
    }

    private static void AppendString(StringBuilder sb, string keyword, string value, string? comment)
    {
        var escaped = value.Replace("'", "''", StringComparison.Ordinal);
        var head = keyword.PadRight(8) + "= ";
        if (escaped.Length <= MaxQuotedContent)
        {
            // Fixed format: the closing quote no earlier than column 20 (section 4.2.1.1).
            var line = head + "'" + escaped.PadRight(8) + "'";
            if (comment is not null)
            {
                var withComment = line + " / " + comment;
                if (withComment.Length <= CardLength)
                {
                    sb.Append(withComment.PadRight(CardLength));
                    return;
                }
                if (value.Length == 0 || KeywordRules.IsCommentaryKeyword(keyword))
                    throw TooLong(keyword);
                // Long comment: move it onto a CONTINUE card, as the long-string convention allows.
            }
            else
            {
                sb.Append(line.PadRight(CardLength));
                return;
            }
        }
        AppendLongString(sb, head, keyword, escaped, comment);
    }

    /// <summary>The CONTINUE convention (section 4.2.1.2): every piece but the last ends with '&amp;'.</summary>
    private static void AppendLongString(StringBuilder sb, string head, string keyword, string escaped, string? comment)
    {
        const int PieceWidth = MaxQuotedContent - 1; // room for the '&'
        var pieces = new List<string>();
        var pos = 0;
        while (pos < escaped.Length)
        {
            var take = Math.Min(PieceWidth, escaped.Length - pos);
            // Never split a doubled quote across two cards.
            if (pos + take < escaped.Length && EndsInsideQuotePair(escaped, pos, take)) take--;
            pieces.Add(escaped.Substring(pos, take));
            pos += take;
        }

        for (var i = 0; i < pieces.Count; i++)
        {
            var last = i == pieces.Count - 1;
            var prefix = i == 0 ? head : "CONTINUE  ";
            var line = prefix + "'" + pieces[i] + (last ? "" : "&") + "'";
            if (last && comment is not null)
            {
                var withComment = line + " / " + comment;
                if (withComment.Length > CardLength)
                {
                    // The comment gets a CONTINUE card of its own, carrying an empty string piece.
                    sb.Append((prefix + "'" + pieces[i] + "&'").PadRight(CardLength));
                    line = "CONTINUE  '' / " + comment;
                    if (line.Length > CardLength) throw TooLong(keyword);
                }
                else line = withComment;
            }
            sb.Append(line.PadRight(CardLength));
        }
    }

    /// <summary>True when the piece [pos, pos+take) ends on the first quote of a '' pair.</summary>
    private static bool EndsInsideQuotePair(string escaped, int pos, int take)
    {
        // Count the run of quotes ending at the cut; an odd run means the cut splits a pair.
        var run = 0;
        for (var i = pos + take - 1; i >= pos && escaped[i] == '\''; i--) run++;
        return run % 2 == 1;
    }

    private static ArgumentException TooLong(string keyword) =>
        new($"Card '{keyword}': the comment does not fit in an 80-character card. Shorten the comment.", "card");
}
