using System.Diagnostics;
using System.Text;

namespace Mosaic.Testing;

/// <summary>Runs an outside program to its end within a time limit, with its output captured.</summary>
public static class ExternalProgram
{
    public static readonly TimeSpan DefaultTimeout = TimeSpan.FromMinutes(2);

    /// <summary>Runs <paramref name="program"/> and returns how it ended, whatever its exit code.</summary>
    /// <exception cref="InvalidOperationException">The program is not installed.</exception>
    /// <exception cref="TimeoutException">It ran past <paramref name="timeout"/> and was killed.</exception>
    public static ProgramResult Run(string program, IEnumerable<string> arguments, string? workingDirectory = null,
        string? standardInput = null, TimeSpan? timeout = null)
    {
        if (Path.IsPathRooted(program) && !File.Exists(program))
            throw new InvalidOperationException($"{program} is not installed");
        var start = new ProcessStartInfo(program) { WorkingDirectory = workingDirectory ?? "" };
        var list = arguments.ToList();
        foreach (var argument in list) start.ArgumentList.Add(argument);
        return Run(start, string.Join(' ', [Path.GetFileName(program), .. list]), standardInput, timeout);
    }

    internal static ProgramResult Run(ProcessStartInfo start, string label, string? standardInput, TimeSpan? timeout)
    {
        var limit = timeout ?? DefaultTimeout;
        RedirectAll(start);
        using var process = Process.Start(start) ?? throw new InvalidOperationException($"could not start {start.FileName}");
        // Both pipes drained while the program runs, so neither can fill up and stall it.
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        var feed = Task.Run(() => Feed(process.StandardInput, standardInput));
        if (!process.WaitForExit(limit) || !Task.WaitAll([stdout, stderr, feed], limit))
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException($"{label} did not finish within {limit.TotalSeconds:0} s");
        }
        return new ProgramResult(process.ExitCode, stdout.Result, stderr.Result);
    }

    internal static void RedirectAll(ProcessStartInfo start)
    {
        start.UseShellExecute = false;
        start.RedirectStandardInput = true;
        start.RedirectStandardOutput = true;
        start.RedirectStandardError = true;
        start.StandardInputEncoding = new UTF8Encoding(encoderShouldEmitUTF8Identifier: false);
    }

    /// <summary>Writes the input, then closes the pipe so a program that reads it sees its end.</summary>
    private static void Feed(StreamWriter input, string? text)
    {
        try
        {
            if (text is not null) input.Write(text);
            input.Close();
        }
        catch (IOException)
        {
            // The program ended without reading all of it; its exit code and stderr tell why.
        }
    }
}
