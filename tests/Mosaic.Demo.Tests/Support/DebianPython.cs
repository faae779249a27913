using System.Diagnostics;
using System.Text.Json;
using System.Text.Json.Nodes;

namespace Mosaic.Demo.Tests.Support;

/// <summary>
/// Runs the reference probe (Python/astropy_probe.py) under Debian's /usr/bin/python3 with python3-astropy and
/// python3-numpy. One probe process serves the whole test run, so astropy is imported once. A missing interpreter
/// or package fails the test with the install command; it never skips.
/// </summary>
internal static class DebianPython
{
    public const string Interpreter = "/usr/bin/python3";

    private static readonly object Gate = new();
    private static readonly Lazy<string?> Problem = new(CheckInstall);
    private static readonly System.Text.StringBuilder ProbeErrors = new();
    private static Process? _probe;

    /// <summary>Sends the operations, returns one JSON result per operation.</summary>
    public static JsonArray Probe(params object[] operations)
    {
        if (Problem.Value is { } problem) Assert.Fail(problem);
        lock (Gate)
        {
            var probe = _probe is { HasExited: false } ? _probe : _probe = Start();
            probe.StandardInput.WriteLine(JsonSerializer.Serialize(operations));
            probe.StandardInput.Flush();
            var line = probe.StandardOutput.ReadLine();
            if (line is null)
            {
                _probe = null;
                var exit = probe.WaitForExit(5000) ? probe.ExitCode : -1;
                lock (ProbeErrors) Assert.Fail($"The astropy probe stopped (exit {exit}):\n{ProbeErrors}");
            }
            var reply = JsonNode.Parse(line)!;
            if (!(bool)reply["ok"]!) Assert.Fail($"The astropy probe failed:\n{(string?)reply["error"]}");
            return reply["results"]!.AsArray();
        }
    }

    private static Process Start()
    {
        var script = Path.Combine(AppContext.BaseDirectory, "Python", "astropy_probe.py");
        var start = StartInfo(script);
        start.RedirectStandardInput = true;
        var process = Process.Start(start) ?? throw new InvalidOperationException($"Could not start {Interpreter}.");
        // Drained as it comes so warnings can never fill the pipe and stall the probe.
        process.ErrorDataReceived += (_, e) =>
        {
            if (e.Data is not null) lock (ProbeErrors) ProbeErrors.AppendLine(e.Data);
        };
        process.BeginErrorReadLine();
        return process;
    }

    private static string? CheckInstall()
    {
        if (!File.Exists(Interpreter))
            return $"{Interpreter} is missing: these tests need Debian's python3 with python3-astropy and python3-numpy (apt-get install python3-astropy python3-numpy).";
        using var process = Process.Start(StartInfo("-c", "import astropy.wcs, astropy.io.fits, numpy"))
            ?? throw new InvalidOperationException($"Could not start {Interpreter}.");
        var stderr = process.StandardError.ReadToEnd();
        process.WaitForExit();
        return process.ExitCode == 0 ? null
            : $"Debian's python3-astropy and python3-numpy are required (apt-get install python3-astropy python3-numpy); importing them failed:\n{stderr}";
    }

    private static ProcessStartInfo StartInfo(params string[] arguments)
    {
        var start = new ProcessStartInfo(Interpreter)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (var a in arguments) start.ArgumentList.Add(a);
        // Keep a pyenv or virtualenv of the developer out of Debian's interpreter.
        start.Environment.Remove("PYTHONPATH");
        start.Environment.Remove("PYTHONHOME");
        return start;
    }
}
