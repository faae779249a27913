using System.Globalization;
using Mosaic.Testing;

namespace Mosaic.Wcs.Tests.Coordinates;

/// <summary>Runs the coords_*.py reference scripts under Debian's python3-astropy and reads back degree pairs.</summary>
internal static class AstropyCoordinates
{
    /// <summary>Sends one "kind lon lat" line per point to coords_galactic.py; kinds are listed in the script.</summary>
    internal static IReadOnlyList<(double Lon, double Lat)> Transform(string kind, IReadOnlyList<(double Lon, double Lat)> points)
    {
        var input = string.Join('\n', points.Select(p => string.Create(CultureInfo.InvariantCulture, $"{kind} {p.Lon:R} {p.Lat:R}")));
        return ReadPairs(DebianPython.RunFile(Script("coords_galactic.py"), standardInput: input + "\n"), points.Count);
    }

    /// <summary>Parses each text with astropy's SkyCoord; <paramref name="raInHours"/> gives the unit of a sexagesimal RA.</summary>
    internal static IReadOnlyList<(double Lon, double Lat)> Parse(IReadOnlyList<(string Text, bool RaInHours)> texts)
    {
        var input = string.Join('\n', texts.Select(t => (t.RaInHours ? "hourangle" : "deg") + "\t" + t.Text));
        return ReadPairs(DebianPython.RunFile(Script("coords_parse.py"), standardInput: input + "\n"), texts.Count);
    }

    private static string Script(string name) => Path.Combine(AppContext.BaseDirectory, "Reference", name);

    private static List<(double, double)> ReadPairs(string output, int expected)
    {
        var lines = output.Split('\n', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries);
        if (lines.Length != expected)
            throw new InvalidOperationException($"astropy printed {lines.Length} lines for {expected} inputs:\n{output}");
        return lines.Select(line =>
        {
            var parts = line.Split(' ');
            return (double.Parse(parts[0], CultureInfo.InvariantCulture), double.Parse(parts[1], CultureInfo.InvariantCulture));
        }).ToList();
    }
}
