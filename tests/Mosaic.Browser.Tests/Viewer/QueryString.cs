namespace Mosaic.Browser.Tests.Viewer;

/// <summary>Every parameter of a URL's query (the last value where one repeats), decoded as RFC 3986 / HTML forms do.</summary>
public static class QueryString
{
    public static IReadOnlyDictionary<string, string> Parse(string url)
    {
        var values = new Dictionary<string, string>(StringComparer.Ordinal);
        var query = url.Contains('?', StringComparison.Ordinal) ? url[(url.IndexOf('?', StringComparison.Ordinal) + 1)..] : "";
        var hash = query.IndexOf('#', StringComparison.Ordinal);
        if (hash >= 0) query = query[..hash];
        foreach (var pair in query.Split('&', StringSplitOptions.RemoveEmptyEntries))
        {
            var parts = pair.Split('=', 2);
            values[Decode(parts[0])] = parts.Length > 1 ? Decode(parts[1]) : "";
        }
        return values;
    }

    /// <summary>The path and query of a URL without its origin, for comparing tile URLs across pages.</summary>
    public static string PathAndQuery(string url) => new Uri(url).PathAndQuery;

    private static string Decode(string text) => Uri.UnescapeDataString(text.Replace('+', ' '));
}
