using System.Diagnostics;
using System.Runtime.InteropServices;

namespace Mosaic.Imaging.Tests.Display;

/// <summary>
/// Runs a check script under Debian's /usr/bin/python3 (python3-numpy, python3-astropy, python3-pil), never a
/// python found on PATH. A missing interpreter or package fails the test, naming the Debian package to install.
/// </summary>
internal static class OutsideReference
{
    public const string Interpreter = "/usr/bin/python3";

    private const int MissingModule = 3;

    private const string Prelude = """
        import sys, json
        try:
            import numpy as np
            import astropy
            from astropy.visualization import AsinhStretch, LinearStretch, ManualInterval
            from PIL import Image
        except ImportError as e:
            sys.stderr.write(str(e))
            sys.exit(3)
        """;

    /// <summary>Runs the script in <paramref name="folder"/> and returns what it printed.</summary>
    public static string Run(string script, string folder)
    {
        if (!File.Exists(Interpreter))
            throw new InvalidOperationException($"these checks need Debian's python3 at {Interpreter}: apt-get install python3-numpy python3-astropy python3-pil");
        var start = new ProcessStartInfo(Interpreter)
        {
            WorkingDirectory = folder,
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
        if (process.ExitCode == MissingModule)
            throw new InvalidOperationException($"these checks need Debian's python3-numpy, python3-astropy and python3-pil for {Interpreter} (apt-get install python3-numpy python3-astropy python3-pil): {stderr.Result.Trim()}");
        if (process.ExitCode != 0)
            throw new InvalidOperationException($"reference python script failed ({process.ExitCode}): {stderr.Result}\n{stdout.Result}");
        return stdout.Result;
    }

    public static void WriteFloat64(string path, ReadOnlySpan<double> values) => File.WriteAllBytes(path, MemoryMarshal.AsBytes(values).ToArray());

    public static void WriteFloat32(string path, ReadOnlySpan<float> values) => File.WriteAllBytes(path, MemoryMarshal.AsBytes(values).ToArray());

    public static double[] ReadFloat64(string path) => MemoryMarshal.Cast<byte, double>(File.ReadAllBytes(path)).ToArray();
}
