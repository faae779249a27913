using System.Diagnostics;
using System.Runtime.InteropServices;
using System.Text.Json;

namespace Mosaic.Imaging.Tests.Statistics;

/// <summary>
/// Runs a reference script under Debian's python3 (/usr/bin/python3, with python3-numpy and python3-astropy),
/// never a python found on PATH. A missing interpreter or package fails the test with a message saying what to install.
/// </summary>
internal static class ReferencePython
{
    public const string Interpreter = "/usr/bin/python3";

    /// <summary>Exit code the scripts use when an import fails.</summary>
    private const int MissingPackage = 3;

    public const string Prelude = """
        import sys, json, warnings
        try:
            import numpy as np
            from astropy.io import fits
        except ImportError as e:
            sys.stderr.write(str(e))
            sys.exit(3)
        """;

    /// <summary>Runs <paramref name="script"/> (after <see cref="Prelude"/>) in <paramref name="workingDirectory"/>.</summary>
    public static void Run(string script, string workingDirectory)
    {
        if (!File.Exists(Interpreter))
            throw new InvalidOperationException($"reference checks need Debian's python3 at {Interpreter} with python3-numpy and python3-astropy (apt-get install python3-numpy python3-astropy)");
        var start = new ProcessStartInfo(Interpreter)
        {
            WorkingDirectory = workingDirectory,
            RedirectStandardInput = true,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        start.ArgumentList.Add("-");
        foreach (var variable in new[] { "PYTHONPATH", "PYTHONHOME", "PYTHONSTARTUP", "PYTHONUSERBASE" }) start.Environment.Remove(variable);
        using var process = Process.Start(start) ?? throw new InvalidOperationException($"could not start {Interpreter}");
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        process.StandardInput.Write(Prelude + "\n" + script);
        process.StandardInput.Close();
        if (!process.WaitForExit(TimeSpan.FromMinutes(2)))
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException("reference python script ran over two minutes");
        }
        if (process.ExitCode == MissingPackage)
            throw new InvalidOperationException($"reference checks need python3-numpy and python3-astropy (Debian packages) for {Interpreter}: {stderr.Result.Trim()}");
        if (process.ExitCode != 0)
            throw new InvalidOperationException($"reference python script failed ({process.ExitCode}): {stderr.Result}\n{stdout.Result}");
    }

    public static float[] ReadFloat32(string path) => MemoryMarshal.Cast<byte, float>(File.ReadAllBytes(path)).ToArray();

    public static double[] ReadFloat64(string path) => MemoryMarshal.Cast<byte, double>(File.ReadAllBytes(path)).ToArray();

    public static JsonElement ReadJson(string path) => JsonDocument.Parse(File.ReadAllBytes(path)).RootElement.Clone();
}
