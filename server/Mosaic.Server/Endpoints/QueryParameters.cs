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
        if (!double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var value) || !double.IsFinite(value))
            throw MosaicRequestException.BadParameter(name, $"'{name}' must be a finite number; got '{text}'.");
        return value;
    }
}
