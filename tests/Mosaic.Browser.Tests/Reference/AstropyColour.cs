using System.Globalization;
using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Browser.Tests.Reference;

/// <summary>
/// The synthetic three-band field of the colour tests, written by astropy.io.fits, and the colours
/// astropy.visualization.make_lupton_rgb (Lupton et al. 2004; Debian python3-astropy) gives its pixels.
/// </summary>
public static class AstropyColour
{
    /// <summary>Writes the field into <paramref name="folder"/>; its sources' centres by band, and the masked square's.</summary>
    public static JsonElement WriteField(string folder) => Run("field", folder);

    public static (byte R, byte G, byte B) Lupton(string folder, (string Red, string Green, string Blue) bands,
        double q, double range, IReadOnlyList<double> minima, int x, int y)
    {
        string F(double v) => v.ToString("R", CultureInfo.InvariantCulture);
        var result = Run("lupton", folder, bands.Red, bands.Green, bands.Blue, F(q), F(range), F(minima[0]), F(minima[1]), F(minima[2]),
            x.ToString(CultureInfo.InvariantCulture), y.ToString(CultureInfo.InvariantCulture));
        return ((byte)result.GetProperty("r").GetInt32(), (byte)result.GetProperty("g").GetInt32(), (byte)result.GetProperty("b").GetInt32());
    }

    private static JsonElement Run(string command, params string[] arguments)
    {
        var script = Path.Combine(AppContext.BaseDirectory, "Reference", "colour_reference.py");
        var stdout = DebianPython.RunFile(script, [command, .. arguments], timeout: TimeSpan.FromSeconds(60));
        var result = JsonDocument.Parse(stdout).RootElement.Clone();
        if (result.TryGetProperty("error", out var error))
            throw new InvalidOperationException($"{error.GetString()} ({DebianPython.InstallCommand})");
        return result;
    }
}
