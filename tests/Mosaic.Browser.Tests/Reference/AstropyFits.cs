using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Browser.Tests.Reference;

/// <summary>
/// Reads FITS files with astropy.io.fits (Debian's python3-astropy, run as /usr/bin/python3 — not a pyenv python),
/// so pixel values and headers the browser shows are checked against a reader outside the project.
/// </summary>
public static class AstropyFits
{
    public static FitsPixel Pixel(string file, int hdu, int x, int y)
    {
        var result = Run("pixel", file, hdu.ToString(), x.ToString(), y.ToString());
        return new FitsPixel(x, y, ReadValue(result));
    }

    /// <summary>The brightest finite pixel at least <paramref name="margin"/> pixels inside every edge.</summary>
    public static FitsPixel Brightest(string file, int hdu, int margin)
    {
        var result = Run("brightest", file, hdu.ToString(), margin.ToString());
        return new FitsPixel(result.GetProperty("x").GetInt32(), result.GetProperty("y").GetInt32(), ReadValue(result));
    }

    /// <summary>A NaN pixel at least <paramref name="margin"/> inside the edges; null if there is none.</summary>
    public static (int X, int Y)? MaskedPixel(string file, int hdu, int margin)
    {
        var result = Run("masked", file, hdu.ToString(), margin.ToString());
        return result.GetProperty("x").ValueKind == JsonValueKind.Null
            ? null
            : (result.GetProperty("x").GetInt32(), result.GetProperty("y").GetInt32());
    }

    public static string? Header(string file, int hdu, string key)
    {
        var value = Run("header", file, hdu.ToString(), key).GetProperty("value");
        return value.ValueKind == JsonValueKind.Null ? null : value.GetString();
    }

    private static double? ReadValue(JsonElement result)
    {
        var value = result.GetProperty("value");
        return value.ValueKind == JsonValueKind.Null ? null : value.GetDouble();
    }

    private static JsonElement Run(string command, params string[] arguments)
    {
        var script = Path.Combine(AppContext.BaseDirectory, "Reference", "fits_reference.py");
        var stdout = DebianPython.RunFile(script, [command, .. arguments], timeout: TimeSpan.FromSeconds(60));
        return JsonDocument.Parse(stdout).RootElement.Clone();
    }
}
