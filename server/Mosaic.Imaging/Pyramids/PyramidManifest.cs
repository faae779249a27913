using System.Text.Json;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Pyramids;

/// <summary>
/// The small JSON file written last into a pyramid folder: its presence and contents mark a complete build.
/// NativeStored says the native level has its own level file too; a manifest without the field (written before
/// the option existed) reads as false, so such a folder keeps reading its native pixels from the plane.
/// </summary>
internal sealed record PyramidManifest(int FormatVersion, int Width, int Height, int MaxZoom, int SourceBitPix, BandStatistics Statistics, bool NativeStored)
{
    public const string Format = "mosaic-pyramid";
    public const int CurrentVersion = 1;

    public void Write(string path)
    {
        using var stream = new FileStream(path, FileMode.CreateNew, FileAccess.Write);
        using var json = new Utf8JsonWriter(stream, new JsonWriterOptions { Indented = true });
        var geometry = new PyramidGeometry(Width, Height);
        json.WriteStartObject();
        json.WriteString("format", Format);
        json.WriteNumber("formatVersion", FormatVersion);
        json.WriteNumber("tileSize", PyramidGeometry.TileSize);
        json.WriteNumber("width", Width);
        json.WriteNumber("height", Height);
        json.WriteNumber("maxZoom", MaxZoom);
        json.WriteStartObject("source");
        json.WriteNumber("width", Width);
        json.WriteNumber("height", Height);
        json.WriteNumber("bitPix", SourceBitPix);
        json.WriteEndObject();
        json.WriteBoolean("nativeStored", NativeStored);
        json.WriteStartArray("levels");
        for (var z = 0; z < (NativeStored ? MaxZoom + 1 : MaxZoom); z++)
        {
            json.WriteStartObject();
            json.WriteNumber("zoom", z);
            json.WriteString("file", PyramidLayout.LevelFile(z));
            json.WriteNumber("width", geometry.LevelWidth(z));
            json.WriteNumber("height", geometry.LevelHeight(z));
            json.WriteNumber("tilesX", geometry.TilesX(z));
            json.WriteNumber("tilesY", geometry.TilesY(z));
            json.WriteEndObject();
        }
        json.WriteEndArray();
        json.WriteString("histogram", PyramidLayout.HistogramFile);
        json.WriteStartObject("statistics");
        json.WriteNumber("count", Statistics.Count);
        json.WriteNumber("masked", Statistics.Masked);
        WriteNumberOrNull(json, "min", Statistics.Min);
        WriteNumberOrNull(json, "max", Statistics.Max);
        WriteNumberOrNull(json, "mean", Statistics.Mean);
        WriteNumberOrNull(json, "median", Statistics.Median);
        WriteNumberOrNull(json, "madSigma", Statistics.MadSigma);
        json.WriteEndObject();
        json.WriteEndObject();
    }

    /// <summary>Reads and checks a manifest; InvalidDataException for a missing, malformed or foreign file.</summary>
    public static PyramidManifest Read(string path)
    {
        byte[] bytes;
        try
        {
            bytes = File.ReadAllBytes(path);
        }
        catch (Exception e) when (e is FileNotFoundException or DirectoryNotFoundException)
        {
            throw new InvalidDataException($"no complete pyramid: {path} is missing", e);
        }
        try
        {
            using var document = JsonDocument.Parse(bytes);
            var root = document.RootElement;
            if (root.ValueKind != JsonValueKind.Object || !root.TryGetProperty("format", out var format) || format.ValueKind != JsonValueKind.String || format.GetString() != Format)
                throw new InvalidDataException($"{path} is not a pyramid manifest");
            var version = root.GetProperty("formatVersion").GetInt32();
            if (version != CurrentVersion)
                throw new InvalidDataException($"{path} has pyramid format version {version}; this build reads version {CurrentVersion}");
            var tileSize = root.GetProperty("tileSize").GetInt32();
            if (tileSize != PyramidGeometry.TileSize)
                throw new InvalidDataException($"{path} has {tileSize}-pixel tiles; expected {PyramidGeometry.TileSize}");
            var source = root.GetProperty("source");
            var stats = root.GetProperty("statistics");
            var statistics = new BandStatistics(stats.GetProperty("count").GetInt64(), stats.GetProperty("masked").GetInt64(),
                ReadNumberOrNull(stats, "min"), ReadNumberOrNull(stats, "max"), ReadNumberOrNull(stats, "mean"),
                ReadNumberOrNull(stats, "median"), ReadNumberOrNull(stats, "madSigma"));
            var nativeStored = root.TryGetProperty("nativeStored", out var stored) && stored.GetBoolean();
            return new PyramidManifest(version, root.GetProperty("width").GetInt32(), root.GetProperty("height").GetInt32(),
                root.GetProperty("maxZoom").GetInt32(), source.GetProperty("bitPix").GetInt32(), statistics, nativeStored);
        }
        catch (Exception e) when (e is JsonException or KeyNotFoundException or InvalidOperationException or FormatException)
        {
            throw new InvalidDataException($"{path} is not a readable pyramid manifest: {e.Message}", e);
        }
    }

    private static void WriteNumberOrNull(Utf8JsonWriter json, string name, double value)
    {
        if (double.IsFinite(value)) json.WriteNumber(name, value);
        else json.WriteNull(name);
    }

    private static double ReadNumberOrNull(JsonElement parent, string name)
    {
        var element = parent.GetProperty(name);
        return element.ValueKind == JsonValueKind.Null ? double.NaN : element.GetDouble();
    }
}
