using System.Diagnostics;
using System.Net;
using System.Net.Sockets;
using System.Text;

namespace Mosaic.Browser.Tests.Hosting;

/// <summary>The real Mosaic server, run from its build output as a child process on a free loopback port.</summary>
public sealed class ServerProcess : IAsyncDisposable
{
    private readonly Process _process;
    private readonly StringBuilder _log = new();
    private bool _disposed;

    private ServerProcess(Process process, Uri baseAddress)
    {
        _process = process;
        BaseAddress = baseAddress;
        process.OutputDataReceived += (_, e) => Append(e.Data);
        process.ErrorDataReceived += (_, e) => Append(e.Data);
        process.BeginOutputReadLine();
        process.BeginErrorReadLine();
    }

    public Uri BaseAddress { get; }

    /// <summary>The last lines the server printed, for failure messages.</summary>
    public string RecentOutput
    {
        get
        {
            lock (_log) return _log.Length <= 4000 ? _log.ToString() : _log.ToString(_log.Length - 4000, 4000);
        }
    }

    /// <summary>Runs `dotnet Mosaic.Server.dll generate-demo --out DIR --preset small` to completion.</summary>
    public static async Task GenerateDemoAsync(string outputDirectory, string preset)
    {
        var start = StartInfo("generate-demo", "--out", outputDirectory, "--preset", preset);
        using var process = Process.Start(start) ?? throw new InvalidOperationException("could not start dotnet");
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        using var timeout = new CancellationTokenSource(TimeSpan.FromMinutes(3));
        await process.WaitForExitAsync(timeout.Token);
        if (process.ExitCode != 0)
            throw new InvalidOperationException($"generate-demo failed ({process.ExitCode}):\n{await stdout}\n{await stderr}");
    }

    /// <summary>
    /// Starts the server on <paramref name="baseAddress"/> (a free loopback port when null), keeping saved views in
    /// <paramref name="stateDirectory"/> (never the user's own folder in tests).
    /// </summary>
    public static async Task<ServerProcess> StartAsync(string dataDirectory, string cacheDirectory, string stateDirectory, Uri? baseAddress = null,
        IReadOnlyList<string>? moreArguments = null)
    {
        baseAddress ??= new Uri($"http://127.0.0.1:{FreePort()}/");
        var start = StartInfo(["--data", dataDirectory, "--cache", cacheDirectory, "--state", stateDirectory,
            "--urls", baseAddress.ToString().TrimEnd('/'), .. moreArguments ?? []]);
        var process = Process.Start(start) ?? throw new InvalidOperationException("could not start dotnet");
        var server = new ServerProcess(process, baseAddress);
        try
        {
            await server.WaitForHealthAsync(TimeSpan.FromSeconds(60));
        }
        catch
        {
            await server.DisposeAsync();
            throw;
        }
        return server;
    }

    public async ValueTask DisposeAsync()
    {
        // A test may stop a server before the end of its scope (a restart); the scope's dispose then does nothing.
        if (_disposed) return;
        _disposed = true;
        if (!_process.HasExited)
        {
            _process.Kill(entireProcessTree: true);
            await _process.WaitForExitAsync();
        }
        _process.Dispose();
    }

    private async Task WaitForHealthAsync(TimeSpan limit)
    {
        using var http = new HttpClient { BaseAddress = BaseAddress, Timeout = TimeSpan.FromSeconds(5) };
        var deadline = DateTime.UtcNow + limit;
        while (DateTime.UtcNow < deadline)
        {
            if (_process.HasExited)
                throw new InvalidOperationException($"the server exited with code {_process.ExitCode}:\n{RecentOutput}");
            try
            {
                using var response = await http.GetAsync("healthz");
                if (response.StatusCode == HttpStatusCode.OK) return;
            }
            catch (HttpRequestException)
            {
                // Not listening yet.
            }
            catch (TaskCanceledException)
            {
            }
            await Task.Delay(200);
        }
        throw new TimeoutException($"/healthz did not answer 200 within {limit.TotalSeconds} s:\n{RecentOutput}");
    }

    private static ProcessStartInfo StartInfo(params string[] arguments)
    {
        var start = new ProcessStartInfo("dotnet")
        {
            // The content root is the project folder, whose wwwroot/ the client build fills (as with dotnet run).
            WorkingDirectory = RepositoryLayout.ServerProjectDirectory,
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        start.ArgumentList.Add(RepositoryLayout.ServerAssembly);
        foreach (var argument in arguments) start.ArgumentList.Add(argument);
        start.Environment["DOTNET_NOLOGO"] = "1";
        return start;
    }

    private static int FreePort()
    {
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        return ((IPEndPoint)listener.LocalEndpoint).Port;
    }

    private void Append(string? line)
    {
        if (line is null) return;
        lock (_log) _log.AppendLine(line);
    }
}
