using System.Diagnostics;
using System.Text.Json;

namespace Mosaic.Browser.Tests.Reference;

/// <summary>
/// Reads FITS files with astropy.io.fits (Debian's python3-astropy, run as /usr/bin/python3 — not a pyenv python),
/// so pixel values and headers the browser shows are checked against a reader outside the project.
/// </summary>
public static class AstropyFits
{
    private const string Python = "/usr/bin/python3";

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
        if (!File.Exists(Python))
            throw new InvalidOperationException($"{Python} is missing: these tests read FITS with Debian's python3-astropy (apt-get install python3-astropy).");
        var script = Path.Combine(AppContext.BaseDirectory, "Reference", "fits_reference.py");
        var start = new ProcessStartInfo(Python) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        start.ArgumentList.Add(script);
        start.ArgumentList.Add(command);
        foreach (var argument in arguments) start.ArgumentList.Add(argument);
        // Debian's own modules only: a PYTHONPATH or user site from elsewhere must not shadow them.
        start.Environment.Remove("PYTHONPATH");
        start.Environment["PYTHONNOUSERSITE"] = "1";
        using var process = Process.Start(start) ?? throw new InvalidOperationException($"could not start {Python}");
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        if (!process.WaitForExit(TimeSpan.FromSeconds(60)))
        {
            process.Kill();
            throw new TimeoutException($"astropy reference '{command}' took over 60 s");
        }
        if (process.ExitCode == 3)
            throw new InvalidOperationException($"python3-astropy is required (apt-get install python3-astropy python3-numpy): {stdout.Result.Trim()}");
        if (process.ExitCode != 0)
            throw new InvalidOperationException($"astropy reference '{command}' failed ({process.ExitCode}): {stderr.Result}");
        return JsonDocument.Parse(stdout.Result).RootElement.Clone();
    }
}
