using System.Text;
using System.Text.Json;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;

namespace Mosaic.Server.Meetings;

/// <summary>
/// Checks a view state object from a client: a flat JSON object of string values, within the size limits, naming
/// a field this server has, with a link version the client knows. Everything else in it is the client's business.
/// </summary>
public sealed class MeetingStateReader(FieldCatalog catalog, MeetingLimits limits)
{
    private static readonly string[] Versions = ["0", "1"];

    /// <summary>The state as an ordered map; <paramref name="name"/> is how errors name it (e.g. <c>state</c>).</summary>
    public IReadOnlyDictionary<string, string> Read(JsonElement state, string name = "state")
    {
        if (state.ValueKind != JsonValueKind.Object)
            throw Bad(name, $"'{name}' must be a JSON object of string values (a view's link parameters), not {Describe(state.ValueKind)}.");
        var map = new Dictionary<string, string>(StringComparer.Ordinal);
        var bytes = 0;
        foreach (var property in state.EnumerateObject())
        {
            if (map.Count == limits.MaxStateKeys)
                throw Bad(name, $"'{name}' has more than {limits.MaxStateKeys} parameters.");
            if (property.Name.Length == 0) throw Bad(name, $"'{name}' has a parameter with an empty name.");
            if (property.Value.ValueKind != JsonValueKind.String)
                throw Bad($"{name}.{property.Name}", $"'{name}.{property.Name}' must be a string, not {Describe(property.Value.ValueKind)}.");
            var value = property.Value.GetString()!;
            bytes += Encoding.UTF8.GetByteCount(property.Name) + Encoding.UTF8.GetByteCount(value);
            if (bytes > limits.MaxStateBytes) throw Bad(name, $"'{name}' is larger than {limits.MaxStateBytes / 1024} KiB.");
            if (!map.TryAdd(property.Name, value)) throw Bad(name, $"'{name}' names parameter '{property.Name}' twice.");
        }
        if (map.TryGetValue("v", out var version) && !Versions.Contains(version))
            throw Bad($"{name}.v", $"'{name}.v' is link format version '{version}'; this server knows versions 0 and 1.");
        if (!map.TryGetValue("field", out var field) || field.Length == 0)
            throw Bad($"{name}.field", $"'{name}.field' is missing: a view state names the field it shows.");
        if (!HasField(field))
            throw new MeetingException(MeetingError.UnknownField, $"'{name}.field' names '{field}', which is not a field on this server.", $"{name}.field");
        return map;
    }

    private bool HasField(string id)
    {
        try
        {
            catalog.Get(id);
            return true;
        }
        catch (MosaicRequestException e) when (e.Status == StatusCodes.Status404NotFound)
        {
            return false;
        }
    }

    private static MeetingException Bad(string parameter, string message) => new(MeetingError.BadInput, message, parameter);

    private static string Describe(JsonValueKind kind) => kind switch
    {
        JsonValueKind.Undefined => "nothing",
        JsonValueKind.Null => "null",
        JsonValueKind.True or JsonValueKind.False => "a boolean",
        JsonValueKind.Number => "a number",
        JsonValueKind.Array => "an array",
        JsonValueKind.Object => "an object",
        _ => "a string",
    };
}
