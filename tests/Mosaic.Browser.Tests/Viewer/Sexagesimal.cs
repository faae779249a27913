using System.Globalization;

namespace Mosaic.Browser.Tests.Viewer;

/// <summary>
/// Sexagesimal angles as astronomers write them (common practice): RA in hours "hh:mm:ss.sss", Dec in degrees
/// "±dd:mm:ss.ss". Read back from what the page shows, and written for typing into the go-to box.
/// </summary>
public static class Sexagesimal
{
    /// <summary>"hh:mm:ss.s…" or "±dd:mm:ss.s…" as a number of units (hours or degrees), and the seconds' decimals.</summary>
    public static (double Value, int SecondDecimals) Parse(string text)
    {
        var trimmed = text.Trim().Replace('\u2212', '-');
        var negative = trimmed.StartsWith('-');
        var parts = trimmed.TrimStart('+', '-').Split(':');
        if (parts.Length != 3) throw new FormatException($"'{text}' is not sexagesimal h:m:s");
        var whole = int.Parse(parts[0], CultureInfo.InvariantCulture);
        var minutes = int.Parse(parts[1], CultureInfo.InvariantCulture);
        var seconds = double.Parse(parts[2], CultureInfo.InvariantCulture);
        var point = parts[2].IndexOf('.', StringComparison.Ordinal);
        var decimals = point < 0 ? 0 : parts[2].Length - point - 1;
        var value = whole + minutes / 60.0 + seconds / 3600.0;
        return (negative ? -value : value, decimals);
    }

    /// <summary>RA degrees as "hh:mm:ss.ssss" (time seconds to <paramref name="decimals"/> places).</summary>
    public static string FormatRa(double degrees, int decimals) => Format(degrees / 15, decimals, signed: false);

    /// <summary>Dec degrees as "±dd:mm:ss.sss".</summary>
    public static string FormatDec(double degrees, int decimals) => Format(degrees, decimals, signed: true);

    private static string Format(double value, int decimals, bool signed)
    {
        var sign = value < 0 ? "-" : signed ? "+" : "";
        var unit = Math.Pow(10, decimals);
        // Rounded once, in units of the last second digit, so 59.99995 never prints as 60.
        var total = Math.Round(Math.Abs(value) * 3600 * unit);
        var perMinute = 60 * unit;
        var whole = Math.Floor(total / (60 * perMinute));
        var rest = total - whole * 60 * perMinute;
        var minutes = Math.Floor(rest / perMinute);
        var seconds = (rest - minutes * perMinute) / unit;
        var format = decimals > 0 ? "00." + new string('0', decimals) : "00";
        return string.Create(CultureInfo.InvariantCulture, $"{sign}{whole:00}:{minutes:00}:{seconds.ToString(format, CultureInfo.InvariantCulture)}");
    }
}
