using System.Globalization;
using Mosaic.Server.Errors;

namespace Mosaic.Server.Endpoints;

/// <summary>Parses numbers from the query ourselves, so a bad one gets problem details that name it.</summary>
public static class QueryParameters
{
    public static double RequiredFinite(string name, string? text)
    {
        if (string.IsNullOrWhiteSpace(text))
            throw MosaicRequestException.BadParameter(name, $"'{name}' is required.");
        return Finite(name, text);
    }

    /// <summary>Null where the parameter is absent or empty.</summary>
    public static double? OptionalFinite(string name, string? text) =>
        string.IsNullOrWhiteSpace(text) ? null : Finite(name, text);

    public static int RequiredInteger(string name, string? text)
    {
        if (string.IsNullOrWhiteSpace(text))
            throw MosaicRequestException.BadParameter(name, $"'{name}' is required.");
        return Integer(name, text);
    }

    public static int? OptionalInteger(string name, string? text) =>
        string.IsNullOrWhiteSpace(text) ? null : Integer(name, text);

    /// <summary>One of <paramref name="allowed"/> (case-insensitive, returned in its listed spelling); null where absent.</summary>
    public static string? OptionalChoice(string name, string? text, IReadOnlyList<string> allowed)
    {
        if (string.IsNullOrWhiteSpace(text)) return null;
        foreach (var choice in allowed)
            if (string.Equals(choice, text.Trim(), StringComparison.OrdinalIgnoreCase)) return choice;
        throw MosaicRequestException.BadParameter(name, $"'{name}' must be one of {string.Join(", ", allowed)}; got '{text}'.");
    }

    private static double Finite(string name, string text)
    {
        if (!double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var value) || !double.IsFinite(value))
            throw MosaicRequestException.BadParameter(name, $"'{name}' must be a finite number; got '{text}'.");
        return value;
    }

    private static int Integer(string name, string text)
    {
        if (!int.TryParse(text.Trim(), NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out var value))
            throw MosaicRequestException.BadParameter(name, $"'{name}' must be a whole number; got '{text}'.");
        return value;
    }
}
