using System.Globalization;

namespace Mosaic.Wcs.Coordinates;

/// <summary>
/// Reads a sky position as people type it: sexagesimal with colons, spaces or h/m/s, d/m/s, °, ′ (') and ″ (")
/// marks, or decimal degrees, with a comma or spaces between RA and Dec. Sexagesimal RA is in hours unless marked
/// in degrees; decimal RA is in degrees unless marked with h. A sign before the Dec applies to the whole value.
/// </summary>
public static class PositionParser
{
    /// <summary>Parses <paramref name="text"/>.</summary>
    /// <exception cref="PositionFormatException">The text is not a valid position; the message says why.</exception>
    public static SkyPosition Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text);
        var (raFields, decFields) = Split(Tokenize(text));
        var ra = RightAscension(raFields);
        var dec = Declination(decFields);
        return new SkyPosition(ra, dec);
    }

    /// <summary>Parses <paramref name="text"/>, returning false instead of throwing when it is not a valid position.</summary>
    public static bool TryParse(string? text, out SkyPosition? position)
    {
        position = null;
        if (text is null) return false;
        try
        {
            position = Parse(text);
            return true;
        }
        catch (PositionFormatException)
        {
            return false;
        }
    }

    private static List<PositionField> Tokenize(string text)
    {
        var fields = new List<PositionField>();
        var commaSeen = false;
        var i = 0;
        while (i < text.Length)
        {
            var c = text[i];
            if (char.IsWhiteSpace(c)) { i++; continue; }
            if (c == ',')
            {
                if (commaSeen) throw new PositionFormatException($"more than one comma in \"{text}\": use one to separate RA from Dec");
                commaSeen = true;
                // A comma is recorded as a field boundary marker the splitter recognises.
                fields.Add(new PositionField(",", false, false, FieldMark.None, i));
                i++;
                continue;
            }
            var start = i;
            var negative = false;
            var signed = false;
            if (c is '+' or '-' or '\u2212')
            {
                negative = c != '+';
                signed = true;
                i++;
            }
            var digitsStart = i;
            var dots = 0;
            var digits = 0;
            while (i < text.Length && (char.IsAsciiDigit(text[i]) || text[i] == '.'))
            {
                if (text[i] == '.') dots++; else digits++;
                i++;
            }
            if (digits == 0 || dots > 1)
            {
                var bad = i < text.Length ? text[i] : c;
                throw new PositionFormatException(digits == 0
                    ? $"unexpected '{bad}' at position {(i < text.Length ? i : start) + 1} in \"{text}\": expected a number"
                    : $"malformed number \"{text[digitsStart..i]}\" at position {digitsStart + 1} in \"{text}\"");
            }
            var number = text[digitsStart..i];
            var mark = FieldMark.None;
            if (i < text.Length)
            {
                mark = MarkOf(text[i]);
                if (mark != FieldMark.None) i++;
                else if (!char.IsWhiteSpace(text[i]) && text[i] != ',')
                    throw new PositionFormatException($"unexpected '{text[i]}' at position {i + 1} in \"{text}\"");
            }
            fields.Add(new PositionField(number, negative, signed, mark, start));
        }
        if (fields.Count == 0) throw new PositionFormatException("no position given: expected RA and Dec");
        return fields;
    }

    private static FieldMark MarkOf(char c) => c switch
    {
        ':' => FieldMark.Colon,
        'h' or 'H' => FieldMark.Hours,
        'd' or 'D' or '°' => FieldMark.Degrees,
        'm' or 'M' or '\'' or '′' => FieldMark.Minutes,
        's' or 'S' or '"' or '″' => FieldMark.Seconds,
        _ => FieldMark.None,
    };

    private static bool IsComma(PositionField field) => field.Digits == ",";

    /// <summary>Divides the fields into the RA and the Dec.</summary>
    private static (List<PositionField> Ra, List<PositionField> Dec) Split(List<PositionField> fields)
    {
        var comma = fields.FindIndex(IsComma);
        if (comma >= 0)
        {
            var left = fields[..comma];
            var right = fields[(comma + 1)..];
            if (left.Count == 0 || right.Count == 0)
                throw new PositionFormatException("a comma must have the RA before it and the Dec after it");
            return (OneCoordinate(left, "RA"), OneCoordinate(right, "Dec"));
        }
        var groups = Group(fields);
        if (groups.Count == 2) return (groups[0], groups[1]);
        if (groups.Count == 6 && groups.TrueForAll(g => g.Count == 1 && g[0].Mark == FieldMark.None))
            return ([groups[0][0], groups[1][0], groups[2][0]], [groups[3][0], groups[4][0], groups[5][0]]);
        if (groups.Count == 1)
            throw new PositionFormatException("only one coordinate given: expected both RA and Dec");
        throw new PositionFormatException(
            $"could not tell RA from Dec among {groups.Count} values: write two decimal numbers, two sexagesimal values, or six numbers separated by spaces");
    }

    /// <summary>One side of a comma: a single group, or three bare numbers meaning h m s / d m s.</summary>
    private static List<PositionField> OneCoordinate(List<PositionField> fields, string name)
    {
        var groups = Group(fields);
        if (groups.Count == 1) return groups[0];
        if (groups.Count == 3 && groups.TrueForAll(g => g.Count == 1 && g[0].Mark == FieldMark.None))
            return [groups[0][0], groups[1][0], groups[2][0]];
        throw new PositionFormatException($"the {name} has {groups.Count} separate values: expected one number or three (h m s or d m s)");
    }

    /// <summary>Joins fields written as one value: colon-separated, or unit-marked in rising order (h, m, s).</summary>
    private static List<List<PositionField>> Group(List<PositionField> fields)
    {
        var groups = new List<List<PositionField>>();
        List<PositionField>? current = null;
        foreach (var field in fields)
        {
            if (current is not null && Continues(current[^1], field))
            {
                current.Add(field);
                continue;
            }
            if (current is not null && current[^1].Mark == FieldMark.Colon)
                throw new PositionFormatException($"a colon at position {current[^1].Position + current[^1].Digits.Length + 1} is not followed by a minutes or seconds field");
            current = [field];
            groups.Add(current);
        }
        if (current is not null && current[^1].Mark == FieldMark.Colon)
            throw new PositionFormatException("the text ends with a colon: a minutes or seconds field is missing");
        return groups;
    }

    private static bool Continues(PositionField previous, PositionField next)
    {
        if (next.Signed) return false;
        if (previous.Mark == FieldMark.Colon) return true;
        return previous.Level is 0 or 1 && next.Level > previous.Level;
    }

    private static double RightAscension(List<PositionField> fields)
    {
        var first = fields[0];
        if (first.Negative) throw new PositionFormatException("RA cannot be negative");
        if (fields.Count == 1)
        {
            var value = Number(first);
            if (first.Mark == FieldMark.Hours)
            {
                if (value >= 24) throw new PositionFormatException($"RA of {first.Digits} hours is out of range: hours must be below 24");
                return value * 15.0;
            }
            RequireLeading(first, "RA");
            if (value >= 360) throw new PositionFormatException($"RA of {first.Digits} degrees is out of range: degrees must be below 360");
            return value;
        }
        var inDegrees = first.Mark == FieldMark.Degrees;
        var magnitude = Sexagesimal(fields, "RA");
        if (inDegrees)
        {
            if (magnitude >= 360) throw new PositionFormatException($"RA of {first.Digits} degrees is out of range: degrees must be below 360");
            return magnitude;
        }
        if (magnitude >= 24) throw new PositionFormatException($"RA of {first.Digits} hours is out of range: hours must be below 24");
        return magnitude * 15.0;
    }

    private static double Declination(List<PositionField> fields)
    {
        var first = fields[0];
        if (first.Mark == FieldMark.Hours) throw new PositionFormatException("Dec cannot be given in hours");
        double magnitude;
        if (fields.Count == 1)
        {
            RequireLeading(first, "Dec");
            magnitude = Number(first);
        }
        else
        {
            magnitude = Sexagesimal(fields, "Dec");
        }
        if (magnitude > 90) throw new PositionFormatException($"Dec of {(first.Negative ? "-" : "")}{magnitude.ToString("R", CultureInfo.InvariantCulture)}° is out of range: |Dec| must not exceed 90°");
        return first.Negative ? -magnitude : magnitude;
    }

    private static void RequireLeading(PositionField field, string name)
    {
        if (field.Mark is FieldMark.Minutes or FieldMark.Seconds)
            throw new PositionFormatException($"the {name} \"{field.Digits}\" is marked as minutes or seconds but has no hours or degrees field");
    }

    /// <summary>Magnitude of a 2- or 3-field sexagesimal value in its leading unit; the sign is the caller's.</summary>
    private static double Sexagesimal(List<PositionField> fields, string name)
    {
        if (fields.Count > 3) throw new PositionFormatException($"the {name} has {fields.Count} fields: at most three (h m s or d m s)");
        var unitMarked = fields[0].Mark is not FieldMark.Colon and not FieldMark.None;
        if (unitMarked && fields[0].Level != 0)
            throw new PositionFormatException($"the {name} starts with minutes or seconds: the hours or degrees field is missing");
        for (var k = 0; k < fields.Count; k++)
        {
            var field = fields[k];
            var last = k == fields.Count - 1;
            if (k > 0 && field.Signed)
                throw new PositionFormatException($"in the {name} only the first field may carry a sign");
            if (!last && !field.IsInteger)
                throw new PositionFormatException($"in the {name} \"{field.Digits}\" has a fraction but is not the last field");
            if (!unitMarked && !last && fields[0].Mark == FieldMark.Colon && field.Mark != FieldMark.Colon)
                throw new PositionFormatException($"in the {name} colon-separated fields cannot mix with unit marks");
            if (!unitMarked && last && field.Mark is not FieldMark.None and not FieldMark.Colon && fields[0].Mark == FieldMark.Colon)
                throw new PositionFormatException($"in the {name} colon-separated fields cannot mix with unit marks");
        }
        var minutes = Number(fields[1]);
        if (minutes >= 60) throw new PositionFormatException($"in the {name} minutes of {fields[1].Digits} are out of range: they must be below 60");
        var seconds = 0.0;
        if (fields.Count == 3)
        {
            seconds = Number(fields[2]);
            if (seconds >= 60) throw new PositionFormatException($"in the {name} seconds of {fields[2].Digits} are out of range: they must be below 60");
        }
        // Seconds of a field marked as minutes (e.g. 12h30m) are absent, so a unit-marked pair is degrees/hours + minutes.
        if (fields.Count == 2 && unitMarked && fields[1].Mark == FieldMark.Seconds)
            return Number(fields[0]) + minutes / 3600.0;
        return Number(fields[0]) + minutes / 60.0 + seconds / 3600.0;
    }

    private static double Number(PositionField field)
    {
        var value = double.Parse(field.Digits, NumberStyles.AllowDecimalPoint, CultureInfo.InvariantCulture);
        if (!double.IsFinite(value)) throw new PositionFormatException($"the number \"{field.Digits}\" is too large");
        return value;
    }
}
