using System.Diagnostics;
using System.Text;

namespace Mosaic.Testing;

/// <summary>
/// A reference script kept running under Debian's python3 to answer many requests, one line in and one line out
/// each, so its heavy imports happen once per test run. Requests are taken one at a time.
/// </summary>
public sealed class DebianPythonProcess : IDisposable
{
    private readonly Process _process;
    private readonly string _label;
    private readonly StringBuilder _stderr = new();
    private readonly Lock _gate = new();
    private bool _broken;

    private DebianPythonProcess(Process process, string label)
    {
        _process = process;
        _label = label;
    }

    /// <summary>Starts <paramref name="scriptPath"/>, which must answer each line on stdin with one line on stdout.</summary>
    /// <exception cref="InvalidOperationException">Debian's python3 is missing.</exception>
    public static DebianPythonProcess Start(string scriptPath, string? workingDirectory = null)
    {
        if (!File.Exists(scriptPath)) throw new FileNotFoundException($"reference script {scriptPath} is missing", scriptPath);
        var start = DebianPython.StartInfo([scriptPath], workingDirectory);
        ExternalProgram.RedirectAll(start);
        var process = Process.Start(start) ?? throw new InvalidOperationException($"could not start {DebianPython.Interpreter}");
        var session = new DebianPythonProcess(process, Path.GetFileName(scriptPath));
        // Drained as it comes, so warnings can never fill the pipe and stall the script.
        process.ErrorDataReceived += (_, e) =>
        {
            if (e.Data is not null) lock (session._stderr) session._stderr.AppendLine(e.Data);
        };
        process.BeginErrorReadLine();
        return session;
    }

    public bool HasExited => _broken || _process.HasExited;

    /// <summary>Sends one request line and returns the script's reply line.</summary>
    /// <exception cref="InvalidOperationException">The script stopped (a missing module names the install command).</exception>
    /// <exception cref="TimeoutException">No reply within <paramref name="timeout"/> (default two minutes); the script is killed.</exception>
    public string Exchange(string request, TimeSpan? timeout = null)
    {
        if (request.Contains('\n')) throw new ArgumentException("a request must be a single line", nameof(request));
        var limit = timeout ?? ExternalProgram.DefaultTimeout;
        lock (_gate)
        {
            if (_broken) throw new InvalidOperationException($"{_label} stopped earlier: start a new one");
            try
            {
                _process.StandardInput.WriteLine(request);
                _process.StandardInput.Flush();
            }
            catch (IOException)
            {
                throw Stopped();
            }
            var reply = _process.StandardOutput.ReadLineAsync();
            if (!reply.Wait(limit))
            {
                _broken = true;
                _process.Kill(entireProcessTree: true);
                throw new TimeoutException($"{_label} gave no reply within {limit.TotalSeconds:0} s");
            }
            return reply.Result ?? throw Stopped();
        }
    }

    public void Dispose()
    {
        try
        {
            _process.StandardInput.Close();     // the script's end of input: it finishes by itself
        }
        catch (IOException)
        {
            // already gone
        }
        if (!_process.WaitForExit(TimeSpan.FromSeconds(5))) _process.Kill(entireProcessTree: true);
        _process.Dispose();
    }

    private InvalidOperationException Stopped()
    {
        _broken = true;
        var exit = -1;
        if (_process.WaitForExit(TimeSpan.FromSeconds(5)))
        {
            _process.WaitForExit();             // and its stderr read to the end
            exit = _process.ExitCode;
        }
        string stderr;
        lock (_stderr) stderr = _stderr.ToString();
        return DebianPython.Failure($"{_label} stopped", exit, stderr, "");
    }
}
