using System.Text.Json;
using System.Text.Json.Nodes;
using Mosaic.Testing;

namespace Mosaic.Demo.Tests.Support;

/// <summary>
/// Asks the reference probe (Python/astropy_probe.py) under Debian's /usr/bin/python3 with python3-astropy and
/// python3-numpy. One probe process serves the whole test run, so astropy is imported once. A missing interpreter
/// or package fails the test with the install command; it never skips.
/// </summary>
internal static class AstropyProbe
{
    private static readonly Lock Gate = new();
    private static DebianPythonProcess? _probe;

    /// <summary>Sends the operations, returns one JSON result per operation.</summary>
    public static JsonArray Run(params object[] operations)
    {
        string line;
        lock (Gate)
        {
            if (_probe is null || _probe.HasExited)
            {
                _probe?.Dispose();
                _probe = DebianPythonProcess.Start(Path.Combine(AppContext.BaseDirectory, "Python", "astropy_probe.py"));
            }
            try
            {
                line = _probe.Exchange(JsonSerializer.Serialize(operations));
            }
            catch
            {
                _probe.Dispose();
                _probe = null;
                throw;
            }
        }
        var reply = JsonNode.Parse(line)!;
        if (!(bool)reply["ok"]!) Assert.Fail($"The astropy probe failed:\n{(string?)reply["error"]}");
        return reply["results"]!.AsArray();
    }
}
