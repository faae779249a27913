using System.Globalization;

namespace Mosaic.Browser.Tests.Viewer;

/// <summary>
/// One marker read from a page URL's <c>mk</c> parameter in the format README.md documents: markers joined by
/// <c>*</c>, fields by <c>_</c>, the kind letter first (lower case on the sky, upper case in pixels), the label last.
/// </summary>
public sealed record MarkerToken(char Letter, IReadOnlyList<double> Numbers, string? Hdu, string Label)
{
    public static IReadOnlyList<MarkerToken> FromUrl(string url)
    {
        var pair = new Uri(url).Query.TrimStart('?').Split('&').FirstOrDefault(p => p.StartsWith("mk=", StringComparison.Ordinal));
        if (pair is null) return [];
        var value = Uri.UnescapeDataString(pair[3..].Replace('+', ' '));
        return [.. value.Split('*').Select(Parse)];
    }

    private static MarkerToken Parse(string token)
    {
        var letter = token[0];
        var sky = char.IsLower(letter);
        var sizes = char.ToLowerInvariant(letter) switch { 'p' => 0, 'c' => 1, 'b' => 2, _ => throw new FormatException(token) };
        var parts = token[1..].Split('_');
        var hdu = sky ? null : parts[0];
        var numbers = parts.Skip(sky ? 0 : 1).Take((sky ? 2 : 2) + sizes).Select(p => double.Parse(p, CultureInfo.InvariantCulture)).ToList();
        var used = (sky ? 0 : 1) + 2 + sizes;
        var label = string.Join('_', parts.Skip(used)).Replace("%2A", "*", StringComparison.Ordinal).Replace("%25", "%", StringComparison.Ordinal);
        return new MarkerToken(letter, numbers, hdu, label);
    }
}
