using System.Text.Json;
using System.Text.Json.Nodes;
using Mosaic.Canvas.Tests.Fields;
using Mosaic.Testing;

namespace Mosaic.Canvas.Tests;

/// <summary>Runs Reference/canvas_reference.py under Debian's python3 (astropy.wcs and numpy); fails, never skips, if they are missing.</summary>
internal static class CanvasReference
{
    private static string Script => Path.Combine(AppContext.BaseDirectory, "Reference", "canvas_reference.py");

    public static JsonObject CanvasCards(CanvasPlan plan)
    {
        var cards = new JsonObject();
        foreach (var card in plan.Cards)
            if (card.Value is not null) cards[card.Keyword] = JsonValue.Create(card.Value);
        return cards;
    }

    private static JsonArray ChipList(SyntheticField field) =>
        new(field.ReferenceChips.Select(c => (JsonNode?)new JsonObject { ["file"] = c.File, ["hdu"] = c.Hdu }).ToArray());

    private static JsonDocument Run(JsonObject request) =>
        JsonDocument.Parse(DebianPython.RunFile(Script, standardInput: request.ToJsonString()));

    private static (double X, double Y)? Pair(JsonElement e) =>
        e.ValueKind == JsonValueKind.Null ? null : (e[0].GetDouble(), e[1].GetDouble());

    /// <summary>Chip pixels (1-based, per chip) → sky by all_pix2world → canvas pixels by the canvas header.</summary>
    public static List<List<(double X, double Y)?>> Place(CanvasPlan plan, SyntheticField field, IReadOnlyList<IReadOnlyList<(double X, double Y)>> points)
    {
        using var reply = Run(new JsonObject
        {
            ["mode"] = "place",
            ["canvas"] = CanvasCards(plan),
            ["chips"] = ChipList(field),
            ["points"] = new JsonArray(points.Select(list => (JsonNode?)new JsonArray(list.Select(p => (JsonNode?)new JsonArray(p.X, p.Y)).ToArray())).ToArray()),
        });
        return reply.RootElement.GetProperty("canvas").EnumerateArray().Select(chip => chip.EnumerateArray().Select(Pair).ToList()).ToList();
    }

    /// <summary>Canvas pixels → each chip's exact pixel (null where astropy finds none), and each chip centre's canvas pixel.</summary>
    public static (List<List<(double X, double Y)?>> Positions, List<(double X, double Y)> Centres) Map(CanvasPlan plan, SyntheticField field,
        IReadOnlyList<(double X, double Y)> canvasPoints)
    {
        using var reply = Run(new JsonObject
        {
            ["mode"] = "map",
            ["canvas"] = CanvasCards(plan),
            ["chips"] = ChipList(field),
            ["points"] = new JsonArray(canvasPoints.Select(p => (JsonNode?)new JsonArray(p.X, p.Y)).ToArray()),
        });
        var positions = reply.RootElement.GetProperty("positions").EnumerateArray().Select(p => p.EnumerateArray().Select(Pair).ToList()).ToList();
        var centres = reply.RootElement.GetProperty("centres").EnumerateArray().Select(c => (c[0].GetDouble(), c[1].GetDouble())).ToList();
        return (positions, centres);
    }

    /// <summary>The reference canvas: values, class, owner (1 + chip index, 0 none) and the number of chips holding each pixel.</summary>
    public sealed record Resampled(float[] Values, byte[] Classes, byte[] Owners, byte[] Held);

    /// <summary>The whole canvas resampled by the documented method at exact positions, and each pixel's class.</summary>
    public static Resampled Resample(CanvasPlan plan, SyntheticField field, double eps, double jump)
    {
        string values = field.TempPath($"reference-{Guid.NewGuid():N}.f32"), classes = field.TempPath($"classes-{Guid.NewGuid():N}.u8");
        string owners = field.TempPath($"owners-{Guid.NewGuid():N}.u8"), held = field.TempPath($"held-{Guid.NewGuid():N}.u8");
        using var reply = Run(new JsonObject
        {
            ["mode"] = "resample",
            ["canvas"] = CanvasCards(plan),
            ["chips"] = ChipList(field),
            ["eps"] = eps,
            ["jump"] = jump,
            ["values"] = values,
            ["classes"] = classes,
            ["owners"] = owners,
            ["held"] = held,
        });
        var bytes = File.ReadAllBytes(values);
        var floats = new float[bytes.Length / 4];
        Buffer.BlockCopy(bytes, 0, floats, 0, bytes.Length);    // little-endian float32, as written by numpy "<f4"
        return new Resampled(floats, File.ReadAllBytes(classes), File.ReadAllBytes(owners), File.ReadAllBytes(held));
    }

    /// <summary>Sky positions → pixels of each chip header (cards only) and of the canvas.</summary>
    public static (List<List<(double X, double Y)?>> Chips, List<(double X, double Y)?> Canvas) Sky(CanvasPlan plan,
        IReadOnlyList<IReadOnlyDictionary<string, object>> headers, IReadOnlyList<(double Ra, double Dec)> sky)
    {
        using var reply = Run(new JsonObject
        {
            ["mode"] = "sky",
            ["canvas"] = CanvasCards(plan),
            ["headers"] = new JsonArray(headers.Select(h => (JsonNode?)new JsonObject(h.Select(c => KeyValuePair.Create(c.Key, (JsonNode?)JsonValue.Create(c.Value))))).ToArray()),
            ["sky"] = new JsonArray(sky.Select(p => (JsonNode?)new JsonArray(p.Ra, p.Dec)).ToArray()),
        });
        var chips = reply.RootElement.GetProperty("chips").EnumerateArray().Select(c => c.EnumerateArray().Select(Pair).ToList()).ToList();
        return (chips, reply.RootElement.GetProperty("canvas").EnumerateArray().Select(Pair).ToList());
    }

    /// <summary>The field centre and the median pixel scale by the plan's definitions, computed by astropy and numpy.</summary>
    public static (double Ra, double Dec, double Scale) Centre(SyntheticField field)
    {
        using var reply = Run(new JsonObject { ["mode"] = "centre", ["chips"] = ChipList(field) });
        var crval = reply.RootElement.GetProperty("crval");
        return (crval[0].GetDouble(), crval[1].GetDouble(), reply.RootElement.GetProperty("scale").GetDouble());
    }
}
