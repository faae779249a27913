using System.Net;
using System.Net.Sockets;
using System.Text;

namespace Mosaic.Server.Tests.Security;

/// <summary>
/// Sends a request line exactly as written over a TCP socket, so no client library normalises the target
/// (HttpClient would resolve "..", re-encode "%2e" and refuse a raw NUL), and reads the whole answer.
/// </summary>
public static class RawHttp
{
    public sealed record Answer(int Status, IReadOnlyDictionary<string, string> Headers, string Body, string Raw);

    /// <param name="from">The local address to send from (any of 127.0.0.0/8 reaches the loopback server); the system's choice when null.</param>
    public static async Task<Answer> SendAsync(int port, string target, string method = "GET", IEnumerable<string>? headers = null, IPAddress? from = null)
    {
        using var tcp = from is null ? new TcpClient() : new TcpClient(new IPEndPoint(from, 0));
        await tcp.ConnectAsync("127.0.0.1", port);
        var stream = tcp.GetStream();
        var request = new StringBuilder($"{method} {target} HTTP/1.1\r\nHost: 127.0.0.1:{port}\r\nConnection: close\r\n");
        foreach (var header in headers ?? []) request.Append(header).Append("\r\n");
        request.Append("\r\n");
        // Latin-1 carries every byte 0-255 as one char, so a NUL or a backslash goes on the wire unchanged.
        await stream.WriteAsync(Encoding.Latin1.GetBytes(request.ToString()));
        using var reply = new MemoryStream();
        using var cancel = new CancellationTokenSource(TimeSpan.FromSeconds(30));
        await stream.CopyToAsync(reply, cancel.Token);
        // Latin-1 again, so chunk sizes (in bytes) index the text one char per byte; the body is UTF-8 decoded at the end.
        var raw = Encoding.Latin1.GetString(reply.ToArray());
        var split = raw.IndexOf("\r\n\r\n", StringComparison.Ordinal);
        if (split < 0) throw new InvalidDataException($"no HTTP header block in the answer to {target}: '{raw}'");
        var lines = raw[..split].Split("\r\n");
        var status = int.Parse(lines[0].Split(' ')[1], System.Globalization.CultureInfo.InvariantCulture);
        var map = new Dictionary<string, string>(StringComparer.OrdinalIgnoreCase);
        foreach (var line in lines.Skip(1))
        {
            var colon = line.IndexOf(':', StringComparison.Ordinal);
            if (colon > 0) map[line[..colon].Trim()] = line[(colon + 1)..].Trim();
        }
        var body = raw[(split + 4)..];
        if (map.TryGetValue("Transfer-Encoding", out var te) && te.Contains("chunked", StringComparison.OrdinalIgnoreCase)) body = Unchunk(body);
        return new Answer(status, map, Encoding.UTF8.GetString(Encoding.Latin1.GetBytes(body)), raw);
    }

    private static string Unchunk(string body)
    {
        var text = new StringBuilder();
        var at = 0;
        while (at < body.Length)
        {
            var end = body.IndexOf("\r\n", at, StringComparison.Ordinal);
            if (end < 0) break;
            var size = Convert.ToInt32(body[at..end].Split(';')[0], 16);
            if (size == 0) break;
            text.Append(body, end + 2, size);
            at = end + 2 + size + 2;
        }
        return text.ToString();
    }
}
