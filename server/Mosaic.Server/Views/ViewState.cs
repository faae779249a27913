using System.Text;
using System.Text.Json;
using Mosaic.Server.Errors;

namespace Mosaic.Server.Views;

/// <summary>
/// The view state object on the wire: a flat JSON object of string → string, exactly a link's query parameters,
/// with repeated parameters joined by "\n" in one value. Opaque to the server apart from "field" and "v".
/// </summary>
public static class ViewState
{
    public const int MaxKeys = 200;

    /// <summary>Of the state object as UTF-8 JSON.</summary>
    public const int MaxBytes = 16 * 1024;

    public const int MaxKeyLength = 64;

    private static readonly string[] Versions = ["0", "1"];

    /// <summary>The pairs of a state object, in their order; bad input names the part of the body ("state", "state.z").</summary>
    /// <exception cref="MosaicRequestException">400 naming the part that is wrong.</exception>
    public static IReadOnlyList<KeyValuePair<string, string>> Parse(JsonElement state)
    {
        if (state.ValueKind != JsonValueKind.Object)
            throw Bad("state", $"'state' must be a JSON object of parameter names to string values; got {Kind(state)}.");
        var size = Encoding.UTF8.GetByteCount(state.GetRawText());
        if (size > MaxBytes)
            throw Bad("state", $"'state' is {size} bytes of JSON; at most {MaxBytes} are kept.");
        var pairs = new List<KeyValuePair<string, string>>();
        var seen = new HashSet<string>(StringComparer.Ordinal);
        foreach (var property in state.EnumerateObject())
        {
            var key = property.Name;
            if (key.Length == 0 || key.Length > MaxKeyLength || key.Any(char.IsControl))
                throw Bad("state", $"'state' has a parameter name that is empty, longer than {MaxKeyLength} characters or holds a control character: \"{Shorten(key)}\".");
            if (!seen.Add(key))
                throw Bad($"state.{key}", $"'state.{key}' is given twice; repeated parameters are joined with a newline in one value.");
            if (property.Value.ValueKind != JsonValueKind.String)
                throw Bad($"state.{key}", $"'state.{key}' must be a string; got {Kind(property.Value)}.");
            pairs.Add(new(key, property.Value.GetString()!));
            if (pairs.Count > MaxKeys)
                throw Bad("state", $"'state' has more than {MaxKeys} parameters.");
        }
        var field = Value(pairs, "field");
        if (string.IsNullOrWhiteSpace(field))
            throw Bad("state.field", "'state.field' is required: the field the view shows.");
        if (Value(pairs, "v") is { } version && !Versions.Contains(version))
            throw Bad("state.v", $"'state.v' = \"{Shorten(version)}\" is not a link format this server knows; it knows {string.Join(" and ", Versions)} (or none, meaning 0).");
        return pairs;
    }

    public static string? Value(IReadOnlyList<KeyValuePair<string, string>> pairs, string key)
    {
        foreach (var (k, v) in pairs)
            if (k == key) return v;
        return null;
    }

    /// <summary>"/?" and the pairs as a query string; a value holding "\n" becomes that parameter repeated.</summary>
    public static string ToLink(IReadOnlyList<KeyValuePair<string, string>> pairs)
    {
        var query = new StringBuilder("/?");
        foreach (var (key, value) in pairs)
            foreach (var part in value.Split('\n'))
            {
                if (query.Length > 2) query.Append('&');
                query.Append(Uri.EscapeDataString(key)).Append('=').Append(Uri.EscapeDataString(part));
            }
        return query.ToString();
    }

    /// <summary>The pairs as a JSON object, in order (how the state is stored).</summary>
    public static string ToJson(IReadOnlyList<KeyValuePair<string, string>> pairs)
    {
        using var buffer = new MemoryStream();
        using (var writer = new Utf8JsonWriter(buffer))
        {
            writer.WriteStartObject();
            foreach (var (key, value) in pairs) writer.WriteString(key, value);
            writer.WriteEndObject();
        }
        return Encoding.UTF8.GetString(buffer.ToArray());
    }

    /// <summary>Reads back what <see cref="ToJson"/> stored.</summary>
    public static IReadOnlyList<KeyValuePair<string, string>> FromJson(string json)
    {
        using var document = JsonDocument.Parse(json);
        return [.. document.RootElement.EnumerateObject().Select(p => new KeyValuePair<string, string>(p.Name, p.Value.GetString() ?? ""))];
    }

    internal static MosaicRequestException Bad(string part, string detail) =>
        new(StatusCodes.Status400BadRequest, $"Invalid '{part}'", detail, part);

    internal static string Kind(JsonElement element) => element.ValueKind switch
    {
        JsonValueKind.Object => "an object",
        JsonValueKind.Array => "an array",
        JsonValueKind.String => "a string",
        JsonValueKind.Number => "a number",
        JsonValueKind.True or JsonValueKind.False => "a boolean",
        JsonValueKind.Null => "null",
        _ => "nothing",
    };

    private static string Shorten(string text) => text.Length <= 40 ? text : text[..40] + "…";
}
