using System.Globalization;
using Mosaic.Fits.Parsing;

namespace Mosaic.Fits.Compression;

/// <summary>Reads TFIELDS, TTYPEn and TFORMn of a binary table (FITS 4.0 section 7.3) into column positions.</summary>
internal static class TableColumns
{
    public static IReadOnlyList<TableColumn> Parse(Header header, long rowBytes, in ParseContext context)
    {
        var fields = header.GetLong("TFIELDS")
            ?? throw context.Error("TFIELDS", "a binary table needs TFIELDS (section 7.3.1)");
        if (fields < 0 || fields > 999) throw context.Error("TFIELDS", $"TFIELDS = {fields} is outside 0..999 (section 7.3.1)");

        var columns = new List<TableColumn>((int)fields);
        long offset = 0;
        for (var n = 1; n <= fields; n++)
        {
            var keyword = $"TFORM{n}";
            var form = header.GetString(keyword)?.Trim()
                ?? throw context.Error(keyword, $"column {n} has no {keyword} (section 7.3.1)");
            var (type, repeat, descriptor) = ParseForm(form, keyword, context);
            var width = descriptor != 0 ? repeat * (descriptor / 4)
                : type == 'X' ? (repeat + 7) / 8
                : repeat * TableColumn.ElementSize(type);
            var name = header.GetString($"TTYPE{n}")?.Trim() ?? "";
            columns.Add(new TableColumn(n, name, type, repeat, offset, width, descriptor));
            offset += width;
        }
        if (offset != rowBytes)
            throw context.Error("NAXIS1", $"the TFORMn fields add up to {offset} bytes per row, but NAXIS1 = {rowBytes} (section 7.3.1)");
        return columns;
    }

    /// <summary>rTa: repeat count, type letter, and for P/Q the element letter and an optional (max) (section 7.3.5).</summary>
    private static (char Type, long Repeat, int Descriptor) ParseForm(string form, string keyword, in ParseContext context)
    {
        var i = 0;
        while (i < form.Length && char.IsAsciiDigit(form[i])) i++;
        long repeat = 1;
        if (i > 0 && !long.TryParse(form.AsSpan(0, i), NumberStyles.None, CultureInfo.InvariantCulture, out repeat))
            throw context.Error(keyword, $"{keyword} = '{form}' has an unreadable repeat count (section 7.3.1)");
        if (i == form.Length) throw context.Error(keyword, $"{keyword} = '{form}' has no data type letter (section 7.3.1)");
        var letter = form[i];
        if (letter is 'P' or 'Q')
        {
            if (i + 1 >= form.Length || TableColumn.ElementSize(form[i + 1]) == 0 && form[i + 1] != 'X')
                throw context.Error(keyword, $"{keyword} = '{form}': a {letter} descriptor needs an element type letter (section 7.3.5)");
            if (repeat > 1) throw context.Error(keyword, $"{keyword} = '{form}': a descriptor column holds at most one descriptor (section 7.3.5)");
            return (form[i + 1], repeat, letter == 'P' ? 32 : 64);
        }
        if (letter != 'X' && TableColumn.ElementSize(letter) == 0)
            throw context.Error(keyword, $"{keyword} = '{form}' has the unknown data type '{letter}' (section 7.3.1, table 18)");
        return (letter, repeat, 0);
    }
}
