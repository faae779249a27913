using System.Diagnostics;

namespace Mosaic.Testing;

/// <summary>
/// Runs reference scripts under Debian's /usr/bin/python3 with python3-astropy, python3-numpy and python3-pil —
/// never a python found on PATH (a pyenv one may lack them or be another version). A missing interpreter or module
/// fails with the install command; any other failure with the script's stderr.
/// </summary>
public static class DebianPython
{
    public const string Interpreter = "/usr/bin/python3";

    public const string InstallCommand = "apt-get install python3-astropy python3-numpy python3-pil";

    private static readonly string[] ForeignVariables = ["PYTHONPATH", "PYTHONHOME", "PYTHONSTARTUP", "PYTHONUSERBASE"];

    /// <summary>Runs <paramref name="code"/> as <c>python3 -c</c>, so <paramref name="arguments"/> are sys.argv[1:] and
    /// stdin stays free for <paramref name="standardInput"/>; returns what the script printed.</summary>
    /// <exception cref="InvalidOperationException">Python or a module is missing, or the script failed.</exception>
    /// <exception cref="TimeoutException">The script ran past <paramref name="timeout"/> (default two minutes).</exception>
    public static string RunCode(string code, IReadOnlyList<string>? arguments = null, string? workingDirectory = null,
        string? standardInput = null, TimeSpan? timeout = null) =>
        Run(["-c", code, .. arguments ?? []], "inline reference script", workingDirectory, standardInput, timeout);

    /// <summary>Runs the script file at <paramref name="scriptPath"/>; returns what it printed.</summary>
    /// <exception cref="InvalidOperationException">Python or a module is missing, or the script failed.</exception>
    /// <exception cref="TimeoutException">The script ran past <paramref name="timeout"/> (default two minutes).</exception>
    public static string RunFile(string scriptPath, IReadOnlyList<string>? arguments = null, string? workingDirectory = null,
        string? standardInput = null, TimeSpan? timeout = null)
    {
        if (!File.Exists(scriptPath)) throw new FileNotFoundException($"reference script {scriptPath} is missing", scriptPath);
        var label = string.Join(' ', [Path.GetFileName(scriptPath), .. arguments ?? []]);
        return Run([scriptPath, .. arguments ?? []], label, workingDirectory, standardInput, timeout);
    }

    private static string Run(IEnumerable<string> interpreterArguments, string label, string? workingDirectory,
        string? standardInput, TimeSpan? timeout)
    {
        var result = ExternalProgram.Run(StartInfo(interpreterArguments, workingDirectory), label, standardInput, timeout);
        if (result.ExitCode != 0) throw Failure($"{label} failed", result.ExitCode, result.Stderr, result.Stdout);
        return result.Stdout;
    }

    internal static ProcessStartInfo StartInfo(IEnumerable<string> arguments, string? workingDirectory)
    {
        if (!File.Exists(Interpreter))
            throw new InvalidOperationException($"{Interpreter} is missing: the reference checks need Debian's python3 and its packages ({InstallCommand})");
        var start = new ProcessStartInfo(Interpreter) { WorkingDirectory = workingDirectory ?? "" };
        foreach (var argument in arguments) start.ArgumentList.Add(argument);
        // Debian's own modules only: a developer's pyenv, virtualenv or user site must not shadow them.
        foreach (var variable in ForeignVariables) start.Environment.Remove(variable);
        start.Environment["PYTHONNOUSERSITE"] = "1";
        return start;
    }

    /// <summary>The error for a script that ended badly; scripts may report a failed import on stderr or stdout.</summary>
    internal static InvalidOperationException Failure(string what, int exitCode, string stderr, string stdout)
    {
        if ((MissingModule(stderr) ?? MissingModule(stdout)) is { } missing)
            return new InvalidOperationException($"{Interpreter} lacks a module the reference checks need ({missing}): {InstallCommand}");
        var printed = stdout.Trim().Length > 0 ? $"\n{stdout.Trim()}" : "";
        return new InvalidOperationException($"{what} (exit {exitCode}):\n{stderr.Trim()}{printed}");
    }

    private static string? MissingModule(string output) =>
        output.Split('\n').FirstOrDefault(line => line.Contains("No module named", StringComparison.Ordinal))?.Trim();
}
