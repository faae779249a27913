using System.Text.Json;

namespace Mosaic.Browser.Tests.Hosting;

/// <summary>The parts of a field from GET /api/fields/{id} that the tests navigate by.</summary>
public sealed record FieldInfo(string Id, string DefaultBand, int DefaultHdu, IReadOnlyList<BandInfo> Bands)
{
    public BandInfo Band(string name) => Bands.Single(b => b.Name == name);

    public static FieldInfo Parse(JsonElement field) => new(
        field.GetProperty("id").GetString()!,
        field.GetProperty("defaultBand").GetString()!,
        field.GetProperty("defaultHdu").GetInt32(),
        [.. field.GetProperty("bands").EnumerateArray().Select(BandInfo.Parse)]);
}
