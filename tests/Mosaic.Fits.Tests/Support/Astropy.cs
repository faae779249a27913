using System.Diagnostics;

namespace Mosaic.Fits.Tests.Support;

/// <summary>
/// Runs the reference scripts with Debian's /usr/bin/python3 and its python3-astropy (never a python on PATH,
/// which may lack astropy or be another version). Missing pieces fail the test with the install command.
/// </summary>
public static class Astropy
{
    public const string Python = "/usr/bin/python3";

    private const string InstallHint = "Install Debian's packages: apt-get install python3-astropy python3-numpy";

    public static string ScriptFolder => Path.Combine(AppContext.BaseDirectory, "Astropy");

    private static readonly Lazy<string> Availability = new(Check);

    /// <summary>Runs a script from <see cref="ScriptFolder"/>; returns its stdout, or throws with its stderr.</summary>
    public static string Run(string script, params string[] arguments)
    {
        var problem = Availability.Value;
        if (problem.Length > 0) throw new InvalidOperationException(problem);
        var (code, stdout, stderr) = Execute(Python, [Path.Combine(ScriptFolder, script), .. arguments]);
        if (code != 0)
            throw new InvalidOperationException($"{script} {string.Join(' ', arguments)} failed with exit code {code}:\n{stderr}");
        return stdout;
    }

    /// <summary>Runs a script and returns its exit code and stderr, for checks that expect astropy to refuse a file.</summary>
    public static (int ExitCode, string Stdout, string Stderr) TryRun(string script, params string[] arguments)
    {
        var problem = Availability.Value;
        if (problem.Length > 0) throw new InvalidOperationException(problem);
        return Execute(Python, [Path.Combine(ScriptFolder, script), .. arguments]);
    }

    public static (int ExitCode, string Stdout, string Stderr) Execute(string program, IEnumerable<string> arguments)
    {
        var start = new ProcessStartInfo(program)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
            WorkingDirectory = ScriptFolder,
        };
        foreach (var a in arguments) start.ArgumentList.Add(a);
        using var process = Process.Start(start) ?? throw new InvalidOperationException($"cannot start {program}");
        var stderr = process.StandardError.ReadToEndAsync();
        var stdout = process.StandardOutput.ReadToEnd();
        if (!process.WaitForExit(TimeSpan.FromMinutes(2)))
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException($"{program} did not finish within 2 minutes");
        }
        return (process.ExitCode, stdout, stderr.Result);
    }

    private static string Check()
    {
        if (!File.Exists(Python)) return $"{Python} not found. {InstallHint}";
        var (code, _, stderr) = Execute(Python, ["-c", "import astropy.io.fits, numpy"]);
        return code == 0 ? "" : $"{Python} cannot import astropy.io.fits and numpy ({stderr.Trim()}). {InstallHint}";
    }
}
