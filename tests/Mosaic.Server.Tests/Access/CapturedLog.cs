using System.Collections.Concurrent;
using Microsoft.Extensions.Logging;

namespace Mosaic.Server.Tests.Access;

/// <summary>Every message the server logs, at every level, with its exception text, for the no-secrets check.</summary>
public sealed class CapturedLog : ILoggerProvider
{
    private readonly ConcurrentQueue<string> _lines = new();

    public IReadOnlyList<string> Lines => _lines.ToArray();

    public ILogger CreateLogger(string categoryName) => new Logger(categoryName, _lines);

    public void Dispose()
    {
    }

    private sealed class Logger(string category, ConcurrentQueue<string> lines) : ILogger
    {
        public IDisposable? BeginScope<TState>(TState state) where TState : notnull
        {
            lines.Enqueue($"{category} scope: {state}");
            return null;
        }

        public bool IsEnabled(LogLevel logLevel) => true;

        public void Log<TState>(LogLevel logLevel, EventId eventId, TState state, Exception? exception, Func<TState, Exception?, string> formatter)
        {
            var structured = state is IEnumerable<KeyValuePair<string, object?>> values ? string.Join(" ", values.Select(v => $"{v.Key}={v.Value}")) : "";
            lines.Enqueue($"{logLevel} {category}: {formatter(state, exception)} {structured} {exception}");
        }
    }
}
