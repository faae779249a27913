using System.Diagnostics;

namespace Mosaic.Server.Tests;

/// <summary>Runs Debian's /usr/bin/python3 (with python3-astropy) to write reference files and read values back.</summary>
internal static class ReferencePython
{
    private const string Interpreter = "/usr/bin/python3";

    public static string Run(string script, params string[] args)
    {
        if (!File.Exists(Interpreter))
            throw new InvalidOperationException($"{Interpreter} is missing: apt-get install python3 python3-astropy");
        var scriptPath = Path.Combine(Path.GetTempPath(), $"mosaic-ref-{Guid.NewGuid():N}.py");
        File.WriteAllText(scriptPath, script);
        try
        {
            var start = new ProcessStartInfo(Interpreter) { RedirectStandardOutput = true, RedirectStandardError = true };
            start.ArgumentList.Add(scriptPath);
            foreach (var a in args) start.ArgumentList.Add(a);
            using var process = Process.Start(start)!;
            var stdout = process.StandardOutput.ReadToEndAsync();
            var stderr = process.StandardError.ReadToEndAsync();
            if (!process.WaitForExit(120_000)) { process.Kill(); throw new TimeoutException("reference python timed out"); }
            if (process.ExitCode != 0)
            {
                var error = stderr.Result;
                if (error.Contains("No module named 'astropy'", StringComparison.Ordinal))
                    throw new InvalidOperationException("Debian's python3-astropy is missing: apt-get install python3-astropy");
                throw new InvalidOperationException($"reference python failed ({process.ExitCode}): {error}");
            }
            return stdout.Result;
        }
        finally
        {
            File.Delete(scriptPath);
        }
    }
}
