using System.Globalization;
using System.Text.Json;
using System.Text.Json.Nodes;
using Mosaic.Testing;

namespace Mosaic.Wcs.Tests;

/// <summary>Runs Reference/astropy_wcs.py (Debian's python3-astropy) on a card set; fails, never skips, if it is missing.</summary>
internal static class AstropyReference
{
    public sealed record Answer(IReadOnlyList<(double, double)?> Sky, IReadOnlyList<(double, double)?> Pixels);

    public static Answer Transform(IReadOnlyDictionary<string, object> cards,
        IReadOnlyList<(double X, double Y)> pixels, IReadOnlyList<(double Lon, double Lat)> sky)
    {
        var request = Request(cards, pixels, sky);
        var script = Path.Combine(AppContext.BaseDirectory, "Reference", "astropy_wcs.py");
        var reply = DebianPython.RunFile(script, standardInput: request.ToJsonString());
        using var document = JsonDocument.Parse(reply);
        return new Answer(Rows(document.RootElement.GetProperty("sky")), Rows(document.RootElement.GetProperty("pixels")));
    }

    /// <summary>Several card sets in one python process; answers in the order given.</summary>
    public static IReadOnlyList<Answer> TransformBatch(
        IReadOnlyList<(IReadOnlyDictionary<string, object> Cards, IReadOnlyList<(double X, double Y)> Pixels, IReadOnlyList<(double Lon, double Lat)> Sky)> requests)
    {
        var batch = new JsonArray(requests.Select(r => (JsonNode?)Request(r.Cards, r.Pixels, r.Sky)).ToArray());
        var script = Path.Combine(AppContext.BaseDirectory, "Reference", "astropy_wcs.py");
        using var document = JsonDocument.Parse(DebianPython.RunFile(script, standardInput: batch.ToJsonString()));
        return document.RootElement.EnumerateArray()
            .Select(e => new Answer(Rows(e.GetProperty("sky")), Rows(e.GetProperty("pixels"))))
            .ToList();
    }

    private static JsonObject Request(IReadOnlyDictionary<string, object> cards,
        IReadOnlyList<(double X, double Y)> pixels, IReadOnlyList<(double Lon, double Lat)> sky) => new()
    {
        ["cards"] = new JsonObject(cards.Select(c => KeyValuePair.Create(c.Key, (JsonNode?)JsonValue.Create(c.Value)))),
        ["pixels"] = new JsonArray(pixels.Select(p => (JsonNode?)new JsonArray(p.X, p.Y)).ToArray()),
        ["sky"] = new JsonArray(sky.Select(p => (JsonNode?)new JsonArray(p.Lon, p.Lat)).ToArray()),
    };

    private static List<(double, double)?> Rows(JsonElement array) =>
        array.EnumerateArray()
            .Select(r => r.ValueKind == JsonValueKind.Null ? ((double, double)?)null : (r[0].GetDouble(), r[1].GetDouble()))
            .ToList();

    public static string Describe(IReadOnlyDictionary<string, object> cards) =>
        string.Join(", ", cards.Select(c => string.Create(CultureInfo.InvariantCulture, $"{c.Key}={c.Value}")));
}
