using System.Globalization;
using Mosaic.Fits;
using Mosaic.Fits.Writing;
using Mosaic.Testing;

namespace Mosaic.Wcs.Tests.Wcslib;

/// <summary>
/// Runs wcslib-tools' wcsware (Debian package wcslib-tools) on a FITS file holding the given cards: -x converts
/// pixels to world coordinates (wcsp2s), -w world to pixels (wcss2p). It prints a fixed number of decimals, so each
/// value comes back with the half-unit of its last printed digit as its precision.
/// </summary>
internal static class WcswareTool
{
    public const string Program = "/usr/bin/wcsware";

    public sealed record Value(double A, double B, double PrecisionA, double PrecisionB);

    public static IReadOnlyList<Value?> PixelToWorld(IReadOnlyDictionary<string, object> cards, IReadOnlyList<(double X, double Y)> pixels) =>
        Run(cards, "-x", pixels, "World:");

    public static IReadOnlyList<Value?> WorldToPixel(IReadOnlyDictionary<string, object> cards, IReadOnlyList<(double Lon, double Lat)> sky) =>
        Run(cards, "-w", sky, "Pixel:");

    private static List<Value?> Run(IReadOnlyDictionary<string, object> cards, string mode, IReadOnlyList<(double, double)> input, string answerLabel)
    {
        if (!File.Exists(Program)) throw new InvalidOperationException($"{Program} is missing: install Debian's wcslib-tools (apt-get install wcslib-tools)");
        var directory = Directory.CreateTempSubdirectory("mosaic-wcsware-");
        try
        {
            var file = Path.Combine(directory.FullName, "wcs.fits");
            using (var stream = File.Create(file))
            using (var writer = new FitsWriter(stream))
                writer.WriteFloatImage(cards.Select(c => new HeaderCard(c.Key, c.Value, null)), 2, 2, new float[4]);
            var text = string.Join('\n', input.Select(p => string.Create(CultureInfo.InvariantCulture, $"{p.Item1:R} {p.Item2:R}"))) + "\n";
            var result = ExternalProgram.Run(Program, [mode, file], standardInput: text);
            if (result.ExitCode != 0) throw new InvalidOperationException($"wcsware {mode} failed (exit {result.ExitCode}):\n{result.Stderr}\n{result.Stdout}");
            return Parse(result.Stdout, answerLabel, input.Count);
        }
        finally
        {
            directory.Delete(recursive: true);
        }
    }

    /// <summary>One block per input line, each opened by the "Enter ... elements:" prompt; an ERROR in a block means no solution.</summary>
    private static List<Value?> Parse(string stdout, string answerLabel, int expected)
    {
        var blocks = stdout.Split("elements:", StringSplitOptions.None).Skip(1).Take(expected).ToList();
        if (blocks.Count != expected) throw new InvalidOperationException($"wcsware answered {blocks.Count} of {expected} inputs:\n{stdout}");
        var answers = new List<Value?>();
        foreach (var block in blocks)
        {
            if (block.Contains("ERROR", StringComparison.Ordinal)) { answers.Add(null); continue; }
            // The echo of the input carries the same label as the answer in the other direction: take the last one.
            var line = block.Split('\n').Last(l => l.TrimStart().StartsWith(answerLabel, StringComparison.Ordinal));
            var parts = line.Trim()[answerLabel.Length..].Split(',', StringSplitOptions.TrimEntries);
            answers.Add(new Value(double.Parse(parts[0], CultureInfo.InvariantCulture), double.Parse(parts[1], CultureInfo.InvariantCulture),
                HalfUnit(parts[0]), HalfUnit(parts[1])));
        }
        return answers;
    }

    private static double HalfUnit(string printed)
    {
        var dot = printed.IndexOf('.');
        var decimals = dot < 0 ? 0 : printed.Length - dot - 1;
        return 0.5 * Math.Pow(10, -decimals);
    }
}
