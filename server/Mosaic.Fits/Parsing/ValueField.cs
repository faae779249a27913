using System.Globalization;
using System.Numerics;
using System.Text;

namespace Mosaic.Fits.Parsing;

/// <summary>Parses the value/comment part of a keyword record: FITS 4.0 sections 4.1.2.3 and 4.2, fixed and free format.</summary>
internal static class ValueField
{
    /// <summary>Value (null when undefined) and comment (null when absent) of text following the value indicator.</summary>
    public static (object? Value, string? Comment) Parse(ReadOnlySpan<char> text, string keyword, in ParseContext context)
    {
        var i = SkipSpaces(text, 0);
        if (i == text.Length) return (null, null);                       // undefined value, section 4.1.2.3
        object? value;
        switch (text[i])
        {
            case '/':
                return (null, CommentAfter(text, i));
            case '\'':
                value = ParseString(text, ref i, keyword, context);
                break;
            case '(':
                value = ParseComplex(text, ref i, keyword, context);
                break;
            default:
                var start = i;
                while (i < text.Length && text[i] != ' ' && text[i] != '/') i++;
                value = ParseToken(text[start..i], keyword, context);
                break;
        }

        i = SkipSpaces(text, i);
        if (i == text.Length) return (value, null);
        if (text[i] != '/')
            throw context.Error(keyword, $"unexpected text after the value: \"{text[i..].ToString().TrimEnd()}\" (a comment must start with '/', section 4.1.2.3)");
        return (value, CommentAfter(text, i));
    }

    private static int SkipSpaces(ReadOnlySpan<char> text, int i)
    {
        while (i < text.Length && text[i] == ' ') i++;
        return i;
    }

    private static string CommentAfter(ReadOnlySpan<char> text, int slash) => text[(slash + 1)..].Trim(' ').ToString();

    /// <summary>Section 4.2.1.1: a doubled quote stands for one quote; trailing spaces are not significant, leading ones are.</summary>
    private static string ParseString(ReadOnlySpan<char> text, ref int i, string keyword, in ParseContext context)
    {
        var sb = new StringBuilder();
        var j = i + 1;
        while (true)
        {
            if (j >= text.Length)
                throw context.Error(keyword, "string value has no closing quote (section 4.2.1.1)");
            var c = text[j];
            if (c == '\'')
            {
                if (j + 1 < text.Length && text[j + 1] == '\'')
                {
                    sb.Append('\'');
                    j += 2;
                    continue;
                }
                j++;
                break;
            }
            sb.Append(c);
            j++;
        }
        i = j;
        var end = sb.Length;
        while (end > 0 && sb[end - 1] == ' ') end--;
        return sb.ToString(0, end);
    }

    /// <summary>Section 4.2.5 and 4.2.6: "(real, imaginary)", each part an integer or a real.</summary>
    private static Complex ParseComplex(ReadOnlySpan<char> text, ref int i, string keyword, in ParseContext context)
    {
        var close = text[i..].IndexOf(')');
        if (close < 0) throw context.Error(keyword, "complex value has no closing ')' (section 4.2.5)");
        var inner = text.Slice(i + 1, close - 1);
        var comma = inner.IndexOf(',');
        if (comma < 0) throw context.Error(keyword, "complex value needs two parts separated by ',' (section 4.2.5)");
        var re = ToDouble(ParseToken(inner[..comma].Trim(' '), keyword, context), keyword, context);
        var im = ToDouble(ParseToken(inner[(comma + 1)..].Trim(' '), keyword, context), keyword, context);
        i += close + 1;
        return new Complex(re, im);
    }

    private static double ToDouble(object value, string keyword, in ParseContext context) => value switch
    {
        long l => l,
        double d => d,
        BigInteger b => (double)b,
        _ => throw context.Error(keyword, "complex value parts must be numbers (section 4.2.5)"),
    };

    /// <summary>A logical (4.2.2), an integer (4.2.3) or a real (4.2.4) with an E or D exponent.</summary>
    private static object ParseToken(ReadOnlySpan<char> token, string keyword, in ParseContext context)
    {
        if (token.Length == 0) throw context.Error(keyword, "empty value");
        if (token is "T") return true;
        if (token is "F") return false;
        if (IsInteger(token))
        {
            if (long.TryParse(token, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out var l)) return l;
            return BigInteger.Parse(token, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture);
        }
        if (IsReal(token))
        {
            Span<char> copy = stackalloc char[token.Length];
            token.CopyTo(copy);
            for (var k = 0; k < copy.Length; k++)
                if (copy[k] is 'D' or 'd') copy[k] = 'E';
            var d = double.Parse(copy, NumberStyles.Float, CultureInfo.InvariantCulture);
            if (!double.IsFinite(d))
                throw context.Error(keyword, $"real value {token} is outside the range of a 64-bit float");
            return d;
        }
        throw context.Error(keyword, $"cannot read the value \"{token}\": not a string, logical, integer, real or complex (section 4.2)");
    }

    private static bool IsInteger(ReadOnlySpan<char> t)
    {
        var i = t[0] is '+' or '-' ? 1 : 0;
        if (i == t.Length) return false;
        for (; i < t.Length; i++)
            if (!char.IsAsciiDigit(t[i])) return false;
        return true;
    }

    private static bool IsReal(ReadOnlySpan<char> t)
    {
        var i = t[0] is '+' or '-' ? 1 : 0;
        var digits = 0;
        while (i < t.Length && char.IsAsciiDigit(t[i])) { i++; digits++; }
        if (i < t.Length && t[i] == '.')
        {
            i++;
            while (i < t.Length && char.IsAsciiDigit(t[i])) { i++; digits++; }
        }
        if (digits == 0) return false;
        if (i < t.Length && t[i] is 'E' or 'e' or 'D' or 'd')
        {
            i++;
            if (i < t.Length && t[i] is '+' or '-') i++;
            var exponentDigits = 0;
            while (i < t.Length && char.IsAsciiDigit(t[i])) { i++; exponentDigits++; }
            if (exponentDigits == 0) return false;
        }
        return i == t.Length;
    }
}
