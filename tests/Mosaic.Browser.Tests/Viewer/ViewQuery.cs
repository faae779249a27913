using System.Globalization;

namespace Mosaic.Browser.Tests.Viewer;

/// <summary>
/// The view state as the page writes it into its URL: ?field=&amp;band=&amp;hdu=&amp;x=&amp;y=&amp;z=. The band's
/// whole field is <c>hdu=canvas</c>: <see cref="WholeField"/> true and <see cref="Hdu"/> null.
/// </summary>
public sealed record ViewQuery(string? Field, string? Band, int? Hdu, double? X, double? Y, double? Z, bool WholeField = false)
{
    public const string WholeFieldHdu = "canvas";

    /// <summary>A view of the band's whole field.</summary>
    public static ViewQuery OnWholeField(string field, string band, double? x = null, double? y = null, double? z = null) =>
        new(field, band, null, x, y, z, WholeField: true);

    public static ViewQuery FromUrl(string url)
    {
        var values = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var pair in new Uri(url).Query.TrimStart('?').Split('&', StringSplitOptions.RemoveEmptyEntries))
        {
            var parts = pair.Split('=', 2);
            values[Decode(parts[0])] = parts.Length > 1 ? Decode(parts[1]) : "";
        }
        var hdu = values.GetValueOrDefault("hdu");
        var wholeField = string.Equals(hdu, WholeFieldHdu, StringComparison.OrdinalIgnoreCase);
        return new ViewQuery(
            values.GetValueOrDefault("field"),
            values.GetValueOrDefault("band"),
            hdu is null || wholeField ? null : int.Parse(hdu, CultureInfo.InvariantCulture),
            Number(values, "x"),
            Number(values, "y"),
            Number(values, "z"),
            wholeField);
    }

    public string ToQuery() => "?" + string.Join("&", new (string Key, string? Value)[]
        {
            ("field", Field), ("band", Band), ("hdu", WholeField ? WholeFieldHdu : Hdu?.ToString(CultureInfo.InvariantCulture)),
            ("x", X?.ToString("R", CultureInfo.InvariantCulture)), ("y", Y?.ToString("R", CultureInfo.InvariantCulture)),
            ("z", Z?.ToString("R", CultureInfo.InvariantCulture)),
        }
        .Where(p => p.Value is not null)
        .Select(p => $"{p.Key}={Uri.EscapeDataString(p.Value!)}"));

    private static double? Number(Dictionary<string, string> values, string key) =>
        values.TryGetValue(key, out var text) ? double.Parse(text, CultureInfo.InvariantCulture) : null;

    private static string Decode(string text) => Uri.UnescapeDataString(text.Replace('+', ' '));
}
