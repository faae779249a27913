namespace Mosaic.Wcs.Header;

/// <summary>A header whose celestial WCS is missing or malformed; <see cref="Keyword"/> names the card at fault.</summary>
public sealed class WcsHeaderException(string keyword, string message) : Exception($"{keyword}: {message}")
{
    public string Keyword { get; } = keyword;
}
