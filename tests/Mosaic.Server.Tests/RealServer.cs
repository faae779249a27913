using System.Diagnostics;
using System.Net;
using System.Net.Sockets;
using System.Text;

namespace Mosaic.Server.Tests;

/// <summary>
/// The built server (Mosaic.Server.dll beside the tests) as a child process with its own environment, for what an
/// in-memory host cannot show: kill -9, the listening address, and whole-process settings such as the GC heap limit.
/// </summary>
public sealed class RealServer : IDisposable
{
    private readonly Process _process;
    private readonly StringBuilder _output = new();

    private RealServer(Process process)
    {
        _process = process;
        process.OutputDataReceived += (_, e) => Append(e.Data);
        process.ErrorDataReceived += (_, e) => Append(e.Data);
        process.BeginOutputReadLine();
        process.BeginErrorReadLine();
    }

    public Uri? BaseAddress { get; private init; }

    public string Output
    {
        get
        {
            lock (_output) return _output.ToString();
        }
    }

    public bool HasExited => _process.HasExited;

    public int ExitCode => _process.ExitCode;

    /// <summary>
    /// Starts the server with these arguments (and --urls on a free loopback port unless <paramref name="chooseAddress"/>
    /// is false); <paramref name="environment"/> adds or (null) removes variables.
    /// </summary>
    public static RealServer Start(IEnumerable<string> arguments, bool chooseAddress = true, IReadOnlyDictionary<string, string?>? environment = null)
    {
        var start = new ProcessStartInfo("dotnet")
        {
            WorkingDirectory = AppContext.BaseDirectory,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        start.ArgumentList.Add(Path.Combine(AppContext.BaseDirectory, "Mosaic.Server.dll"));
        foreach (var argument in arguments) start.ArgumentList.Add(argument);
        Uri? address = null;
        if (chooseAddress)
        {
            address = new Uri($"http://127.0.0.1:{FreePort()}/");
            start.ArgumentList.Add("--urls");
            start.ArgumentList.Add(address.ToString().TrimEnd('/'));
        }
        // The listening address must come from the server alone, not from the environment the tests run in.
        foreach (var variable in new[] { "ASPNETCORE_URLS", "DOTNET_URLS", "URLS", "ASPNETCORE_HTTP_PORTS", "ASPNETCORE_HTTPS_PORTS", "DOTNET_HTTP_PORTS", "HTTP_PORTS" })
            start.Environment.Remove(variable);
        start.Environment["Logging__LogLevel__Default"] = "Warning";
        start.Environment["Logging__LogLevel__Microsoft.Hosting.Lifetime"] = "Information";
        // The start-up report of the heap limit is an Information line.
        start.Environment["Logging__LogLevel__Mosaic.Server.Hosting"] = "Information";
        // Whatever GC settings the test run has must not reach the server, except those a test sets.
        foreach (var name in start.Environment.Keys.Where(k => k.StartsWith("DOTNET_GC", StringComparison.OrdinalIgnoreCase)
                     || k.StartsWith("COMPlus_GC", StringComparison.OrdinalIgnoreCase)).ToList())
            start.Environment.Remove(name);
        foreach (var (name, value) in environment ?? new Dictionary<string, string?>())
        {
            if (value is null) start.Environment.Remove(name);
            else start.Environment[name] = value;
        }
        var process = Process.Start(start) ?? throw new InvalidOperationException("could not start dotnet");
        return new RealServer(process) { BaseAddress = address };
    }

    public async Task WaitForHealthAsync(TimeSpan limit)
    {
        using var http = new HttpClient { BaseAddress = BaseAddress, Timeout = TimeSpan.FromSeconds(5) };
        var deadline = DateTime.UtcNow + limit;
        while (DateTime.UtcNow < deadline)
        {
            if (_process.HasExited) throw new InvalidOperationException($"the server exited with code {_process.ExitCode}:\n{Output}");
            try
            {
                using var response = await http.GetAsync("healthz");
                if (response.StatusCode == HttpStatusCode.OK) return;
            }
            catch (HttpRequestException)
            {
            }
            catch (TaskCanceledException)
            {
            }
            await Task.Delay(100);
        }
        throw new TimeoutException($"/healthz did not answer within {limit.TotalSeconds} s:\n{Output}");
    }

    public async Task WaitForOutputAsync(Func<string, bool> done, TimeSpan limit)
    {
        var deadline = DateTime.UtcNow + limit;
        while (!done(Output) && !_process.HasExited && DateTime.UtcNow < deadline) await Task.Delay(100);
        await Task.Delay(200); // the last lines of a process that exited
    }

    /// <summary>Waits for a line of the output that <paramref name="match"/> accepts; throws with the output if the server exits or time runs out.</summary>
    public async Task<string> WaitForLineAsync(Func<string, bool> match, TimeSpan limit)
    {
        var deadline = DateTime.UtcNow + limit;
        while (DateTime.UtcNow < deadline)
        {
            var line = FindLine(match);
            if (line is not null) return line;
            if (_process.HasExited)
            {
                await Task.Delay(200); // the last lines of a process that exited
                return FindLine(match) ?? throw new InvalidOperationException($"the server exited with code {_process.ExitCode} before the line was written:\n{Output}");
            }
            await Task.Delay(100);
        }
        throw new TimeoutException($"no such line within {limit.TotalSeconds} s:\n{Output}");
    }

    /// <summary>Waits for the process to end (a server that refuses its options); false if it is still running at the limit.</summary>
    public bool WaitForExit(TimeSpan limit)
    {
        var exited = _process.WaitForExit(limit);
        if (exited) _process.WaitForExit(); // the redirected output is complete once this returns
        return exited;
    }

    /// <summary>SIGKILL on Linux (Process.Kill): no shutdown code of the server runs.</summary>
    public void KillHard()
    {
        if (!_process.HasExited) _process.Kill(entireProcessTree: false);
        _process.WaitForExit();
    }

    public void Dispose()
    {
        KillHard();
        _process.Dispose();
    }

    private string? FindLine(Func<string, bool> match) => Output.Split('\n').Select(l => l.TrimEnd('\r')).FirstOrDefault(match);

    private void Append(string? line)
    {
        if (line is null) return;
        lock (_output) _output.AppendLine(line);
    }

    private static int FreePort()
    {
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        return ((IPEndPoint)listener.LocalEndpoint).Port;
    }
}
