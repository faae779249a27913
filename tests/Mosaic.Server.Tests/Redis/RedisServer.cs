using System.Diagnostics;
using System.Net;
using System.Net.Sockets;
using System.Text;

namespace Mosaic.Server.Tests.Redis;

/// <summary>
/// A real redis-server (Debian's redis-server package) of the test's own on a free loopback port, with nothing
/// persisted; it can be stopped and started again on the same port to play an outage. Fails, never skips, when
/// redis-server is not installed.
/// </summary>
public sealed class RedisServer : IDisposable
{
    private readonly string _directory = Path.Combine(Path.GetTempPath(), $"mosaic-redis-{Guid.NewGuid():N}");
    private Process? _process;

    private RedisServer(int port)
    {
        Port = port;
        Directory.CreateDirectory(_directory);
    }

    public int Port { get; }

    /// <summary>The --redis value that reaches it.</summary>
    public string Configuration => $"127.0.0.1:{Port}";

    /// <summary>A server with a port chosen but not running yet: Redis is down until <see cref="Restart"/>.</summary>
    public static RedisServer NotStarted() => new(FreePort());

    public static RedisServer Start()
    {
        var server = new RedisServer(FreePort());
        server.Restart();
        return server;
    }

    /// <summary>Kills the server as a crash would, and waits until the port refuses connections.</summary>
    public void Stop()
    {
        if (_process is null) return;
        _process.Kill(entireProcessTree: true);
        _process.WaitForExit();
        _process.Dispose();
        _process = null;
    }

    /// <summary>Starts it (again) on the same port, empty, and waits until it answers PING.</summary>
    public void Restart()
    {
        Stop();
        var start = new ProcessStartInfo(Executable("redis-server"))
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            WorkingDirectory = _directory,
        };
        foreach (var argument in new[] { "--port", Port.ToString(System.Globalization.CultureInfo.InvariantCulture), "--bind", "127.0.0.1",
                     "--save", "", "--appendonly", "no", "--dir", _directory, "--daemonize", "no",
                     // DEBUG SLEEP plays a Redis that hangs; allowed from loopback only.
                     "--enable-debug-command", "local" })
            start.ArgumentList.Add(argument);
        _process = Process.Start(start) ?? throw new InvalidOperationException("redis-server did not start");
        _process.OutputDataReceived += (_, _) => { };
        _process.ErrorDataReceived += (_, _) => { };
        _process.BeginOutputReadLine();
        _process.BeginErrorReadLine();

        var deadline = DateTime.UtcNow + TimeSpan.FromSeconds(10);
        while (!Answers())
        {
            if (_process.HasExited) throw new InvalidOperationException($"redis-server on port {Port} exited with {_process.ExitCode}");
            if (DateTime.UtcNow > deadline) throw new TimeoutException($"redis-server on port {Port} did not answer PING within 10 s");
            Thread.Sleep(20);
        }
    }

    /// <summary>Runs Redis's own command-line client (redis-cli, Debian redis-tools) against this server; its output, trimmed.</summary>
    public string Cli(params string[] arguments)
    {
        var start = new ProcessStartInfo(Executable("redis-cli")) { RedirectStandardOutput = true, RedirectStandardError = true };
        foreach (var argument in new[] { "-h", "127.0.0.1", "-p", Port.ToString(System.Globalization.CultureInfo.InvariantCulture) }.Concat(arguments))
            start.ArgumentList.Add(argument);
        using var process = Process.Start(start) ?? throw new InvalidOperationException("redis-cli did not start");
        var output = process.StandardOutput.ReadToEnd();
        var error = process.StandardError.ReadToEnd();
        process.WaitForExit();
        if (process.ExitCode != 0) throw new InvalidOperationException($"redis-cli {string.Join(' ', arguments)} failed ({process.ExitCode}): {error}");
        return output.Trim();
    }

    public void Dispose()
    {
        Stop();
        try { Directory.Delete(_directory, recursive: true); } catch (IOException) { }
    }

    /// <summary>Waits until the server stops answering PING within 100 ms (a DEBUG SLEEP under way); fails after 10 s.</summary>
    public void WaitUntilHung()
    {
        var deadline = DateTime.UtcNow + TimeSpan.FromSeconds(10);
        while (Answers(TimeSpan.FromMilliseconds(100)))
        {
            if (DateTime.UtcNow > deadline) throw new TimeoutException($"redis-server on port {Port} kept answering");
            Thread.Sleep(10);
        }
    }

    private bool Answers(TimeSpan? within = null)
    {
        try
        {
            using var client = new TcpClient();
            client.Connect(IPAddress.Loopback, Port);
            if (within is { } limit) client.ReceiveTimeout = (int)limit.TotalMilliseconds;
            var stream = client.GetStream();
            stream.Write("PING\r\n"u8);
            var buffer = new byte[16];
            var read = stream.Read(buffer);
            return Encoding.ASCII.GetString(buffer, 0, read).StartsWith("+PONG", StringComparison.Ordinal);
        }
        catch (SocketException)
        {
            return false;
        }
        catch (IOException)
        {
            return false;
        }
    }

    private static string Executable(string name)
    {
        var folders = (Environment.GetEnvironmentVariable("PATH") ?? "").Split(':', StringSplitOptions.RemoveEmptyEntries).Append("/usr/bin").Append("/usr/sbin");
        return folders.Select(folder => Path.Combine(folder, name)).FirstOrDefault(File.Exists)
            ?? throw new InvalidOperationException(
                $"{name} is not installed: these tests need a real Redis server. Install Debian's redis-server package (tests/run.sh does).");
    }

    private static int FreePort()
    {
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        return ((IPEndPoint)listener.LocalEndpoint).Port;
    }
}
