using System.Text;

namespace Mosaic.Browser.Tests.Viewer;

/// <summary>
/// A CSV file read as RFC 4180 defines it: records end with CRLF, fields are split by commas, a field holding a
/// comma, quote or line break is quoted and its quotes doubled.
/// </summary>
public static class CsvRecords
{
    public static IReadOnlyList<string[]> Parse(string text)
    {
        var records = new List<string[]>();
        var fields = new List<string>();
        var field = new StringBuilder();
        var quoted = false;
        for (var i = 0; i < text.Length; i++)
        {
            var c = text[i];
            if (quoted)
            {
                if (c == '"' && i + 1 < text.Length && text[i + 1] == '"') { field.Append('"'); i++; }
                else if (c == '"') quoted = false;
                else field.Append(c);
            }
            else if (c == '"') quoted = true;
            else if (c == ',') { fields.Add(field.ToString()); field.Clear(); }
            else if (c == '\r' && i + 1 < text.Length && text[i + 1] == '\n')
            {
                fields.Add(field.ToString());
                field.Clear();
                records.Add([.. fields]);
                fields.Clear();
                i++;
            }
            else if (c is '\r' or '\n') throw new FormatException($"a bare line break at character {i}: RFC 4180 records end with CRLF");
            else field.Append(c);
        }
        if (quoted) throw new FormatException("a quoted field is not closed");
        if (field.Length > 0 || fields.Count > 0) throw new FormatException("the last record does not end with CRLF");
        return records;
    }
}
