using System.Globalization;

namespace Mosaic.Browser.Tests.Viewer;

/// <summary>The view state as the page writes it into its URL: ?field=&amp;band=&amp;hdu=&amp;x=&amp;y=&amp;z=.</summary>
public sealed record ViewQuery(string? Field, string? Band, int? Hdu, double? X, double? Y, double? Z)
{
    public static ViewQuery FromUrl(string url)
    {
        var values = new Dictionary<string, string>(StringComparer.Ordinal);
        foreach (var pair in new Uri(url).Query.TrimStart('?').Split('&', StringSplitOptions.RemoveEmptyEntries))
        {
            var parts = pair.Split('=', 2);
            values[Decode(parts[0])] = parts.Length > 1 ? Decode(parts[1]) : "";
        }
        return new ViewQuery(
            values.GetValueOrDefault("field"),
            values.GetValueOrDefault("band"),
            values.TryGetValue("hdu", out var hdu) ? int.Parse(hdu, CultureInfo.InvariantCulture) : null,
            Number(values, "x"),
            Number(values, "y"),
            Number(values, "z"));
    }

    public string ToQuery() => "?" + string.Join("&", new (string Key, string? Value)[]
        {
            ("field", Field), ("band", Band), ("hdu", Hdu?.ToString(CultureInfo.InvariantCulture)),
            ("x", X?.ToString("R", CultureInfo.InvariantCulture)), ("y", Y?.ToString("R", CultureInfo.InvariantCulture)),
            ("z", Z?.ToString("R", CultureInfo.InvariantCulture)),
        }
        .Where(p => p.Value is not null)
        .Select(p => $"{p.Key}={Uri.EscapeDataString(p.Value!)}"));

    private static double? Number(Dictionary<string, string> values, string key) =>
        values.TryGetValue(key, out var text) ? double.Parse(text, CultureInfo.InvariantCulture) : null;

    private static string Decode(string text) => Uri.UnescapeDataString(text.Replace('+', ' '));
}
