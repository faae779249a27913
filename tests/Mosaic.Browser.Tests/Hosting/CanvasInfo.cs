using System.Text.Json;

namespace Mosaic.Browser.Tests.Hosting;

/// <summary>A band's whole field as GET /api/fields/{id} describes it (`canvas`): its grid, pyramid, chips placed and chips left off.</summary>
public sealed record CanvasInfo(int Width, int Height, int MaxZoom, string PyramidState, IReadOnlyList<PlacedChipInfo> Chips,
    IReadOnlyList<ExcludedChipInfo> Excluded)
{
    /// <summary>The band's `canvas`, or null when it is null or absent.</summary>
    public static CanvasInfo? Parse(JsonElement band)
    {
        if (!band.TryGetProperty("canvas", out var canvas) || canvas.ValueKind != JsonValueKind.Object) return null;
        return new CanvasInfo(
            canvas.GetProperty("width").GetInt32(),
            canvas.GetProperty("height").GetInt32(),
            canvas.GetProperty("maxZoom").GetInt32(),
            canvas.GetProperty("pyramid").GetProperty("state").GetString()!,
            [.. canvas.GetProperty("chips").EnumerateArray().Select(PlacedChipInfo.Parse)],
            canvas.TryGetProperty("excluded", out var excluded) && excluded.ValueKind == JsonValueKind.Array
                ? [.. excluded.EnumerateArray().Select(ExcludedChipInfo.Parse)]
                : []);
    }
}
