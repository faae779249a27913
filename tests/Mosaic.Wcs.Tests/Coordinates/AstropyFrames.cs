using System.Text.Json;
using System.Text.Json.Nodes;
using Mosaic.Testing;

namespace Mosaic.Wcs.Tests.Coordinates;

/// <summary>Runs Reference/astropy_frames.py (Debian's python3-astropy and its ERFA) on a card set; fails, never skips, if it is missing.</summary>
internal static class AstropyFrames
{
    public sealed record Answer(string Frame, double? Equinox, IReadOnlyList<(double, double)?> Icrs,
        IReadOnlyList<(double, double)?> Pixels, IReadOnlyList<(double, double)?>? Icrs76);

    public static Answer Transform(IReadOnlyDictionary<string, object> cards,
        IReadOnlyList<(double X, double Y)> pixels, IReadOnlyList<(double Ra, double Dec)> icrs)
    {
        var request = new JsonObject
        {
            ["cards"] = new JsonObject(cards.Select(c => KeyValuePair.Create(c.Key, (JsonNode?)JsonValue.Create(c.Value)))),
            ["pixels"] = new JsonArray(pixels.Select(p => (JsonNode?)new JsonArray(p.X, p.Y)).ToArray()),
            ["icrs"] = new JsonArray(icrs.Select(p => (JsonNode?)new JsonArray(p.Ra, p.Dec)).ToArray()),
        };
        var script = Path.Combine(AppContext.BaseDirectory, "Reference", "astropy_frames.py");
        using var document = JsonDocument.Parse(DebianPython.RunFile(script, standardInput: request.ToJsonString()));
        var root = document.RootElement;
        return new Answer(
            root.GetProperty("frame").GetString()!,
            root.GetProperty("equinox").ValueKind == JsonValueKind.Null ? null : root.GetProperty("equinox").GetDouble(),
            Rows(root.GetProperty("icrs")),
            Rows(root.GetProperty("pixels")),
            root.TryGetProperty("icrs76", out var p76) ? Rows(p76) : null);
    }

    private static List<(double, double)?> Rows(JsonElement array) =>
        array.EnumerateArray()
            .Select(r => r.ValueKind == JsonValueKind.Null ? ((double, double)?)null : (r[0].GetDouble(), r[1].GetDouble()))
            .ToList();
}
