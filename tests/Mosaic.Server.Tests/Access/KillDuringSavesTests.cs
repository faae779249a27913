using System.Collections.Concurrent;
using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using Mosaic.Testing;
using Xunit.Abstractions;

namespace Mosaic.Server.Tests.Access;

/// <summary>
/// Saved views under kill -9: 1,000 saves from 8 concurrent clients, the server SIGKILLed part-way and started again
/// on the same state folder; every save answered 201 must be there, as the server reads it and as Python's sqlite3
/// module (Debian python3, its own SQLite) reads the file.
/// </summary>
public sealed class KillDuringSavesTests(AccessFixture fixture, ITestOutputHelper output) : IClassFixture<AccessFixture>
{
    private const int Saves = 1000;
    private const int Clients = 8;
    private const int KillAfterAcknowledged = 350;

    private const string CountScript = """
import sqlite3, sys
ids = set(open(sys.argv[2]).read().split())
db = sqlite3.connect(sys.argv[1])
print(db.execute("PRAGMA integrity_check").fetchone()[0])
stored = {row[0] for row in db.execute("SELECT id FROM views")}
print(len(ids - stored), len(stored))
""";

    [Fact]
    public async Task Every_acknowledged_save_survives_a_kill_9_and_a_restart()
    {
        var state = Path.Combine(fixture.Root, $"state-kill-{Guid.NewGuid():N}");
        string[] Arguments() => ["--data", fixture.DataDirectory, "--cache", fixture.CacheDirectory, "--state", state];
        var acknowledged = new ConcurrentBag<string>();
        var attempted = 0;
        var failedBeforeRestart = 0;

        using (var first = RealServer.Start(Arguments()))
        {
            await first.WaitForHealthAsync(TimeSpan.FromSeconds(90));
            using var killed = new CancellationTokenSource();
            var workers = Enumerable.Range(0, Clients).Select(c => Task.Run(async () =>
            {
                using var http = new HttpClient { BaseAddress = first.BaseAddress, Timeout = TimeSpan.FromSeconds(30) };
                while (!killed.IsCancellationRequested && Interlocked.Increment(ref attempted) <= Saves)
                {
                    // Every increment up to Saves is followed by a POST, so min(attempted, Saves) were sent.
                    if (await TrySaveAsync(http, c) is { } id) acknowledged.Add(id);
                    else Interlocked.Increment(ref failedBeforeRestart);
                    if (acknowledged.Count >= KillAfterAcknowledged && !killed.IsCancellationRequested)
                    {
                        killed.Cancel();
                        first.KillHard();
                    }
                }
            })).ToArray();
            await Task.WhenAll(workers).WaitAsync(TimeSpan.FromMinutes(3));
            Assert.True(first.HasExited, "the server was not killed");
        }
        var beforeKill = acknowledged.Count;
        var sent = Math.Min(Volatile.Read(ref attempted), Saves);
        Assert.True(beforeKill >= KillAfterAcknowledged, $"only {beforeKill} saves were acknowledged before the kill");

        using (var second = RealServer.Start(Arguments()))
        {
            await second.WaitForHealthAsync(TimeSpan.FromSeconds(90));
            using var http = new HttpClient { BaseAddress = second.BaseAddress, Timeout = TimeSpan.FromSeconds(30) };
            var remaining = Saves - sent;
            await Task.WhenAll(Enumerable.Range(0, Clients).Select(c => Task.Run(async () =>
            {
                for (var i = c; i < remaining; i += Clients)
                    acknowledged.Add(await TrySaveAsync(http, c) ?? throw new InvalidOperationException("a save after the restart failed"));
            })));
            var missing = new List<string>();
            foreach (var id in acknowledged)
            {
                using var response = await http.GetAsync($"/api/views/{id}");
                if (response.StatusCode != HttpStatusCode.OK) missing.Add(id);
            }
            Assert.True(missing.Count == 0, $"{missing.Count} acknowledged saves are gone, e.g. {string.Join(", ", missing.Take(5))}");
            second.KillHard();
        }

        var idFile = Path.Combine(state, "acknowledged.txt");
        File.WriteAllLines(idFile, acknowledged);
        var lines = DebianPython.RunCode(CountScript, [Path.Combine(state, "views.db"), idFile]).Split('\n', StringSplitOptions.RemoveEmptyEntries);
        // SQLite's own check of the file (sqlite.org, "PRAGMA integrity_check"): "ok" when nothing is damaged.
        Assert.Equal("ok", lines[0].Trim());
        var counts = lines[1].Split(' ');
        Assert.Equal("0", counts[0]);
        output.WriteLine($"{acknowledged.Count} saves acknowledged ({beforeKill} before SIGKILL, {failedBeforeRestart} cut off by it); " +
            $"after restart all {acknowledged.Count} read back by the server and by python3 sqlite3 ({counts[1]} rows), integrity_check ok");
    }

    private static async Task<string?> TrySaveAsync(HttpClient http, int client)
    {
        try
        {
            using var response = await http.PostAsJsonAsync("/api/views", new
            {
                state = new Dictionary<string, string> { ["field"] = "open", ["x"] = "12.5", ["y"] = "7.5", ["z"] = "1" },
                title = $"client {client}",
            });
            if (response.StatusCode != HttpStatusCode.Created) return null;
            var body = await response.Content.ReadAsStringAsync();
            return JsonDocument.Parse(body).RootElement.GetProperty("id").GetString();
        }
        catch (Exception e) when (e is HttpRequestException or TaskCanceledException or IOException or JsonException)
        {
            return null; // cut off by the kill: never acknowledged
        }
    }
}
