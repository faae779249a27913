using System.Diagnostics;

namespace Mosaic.Server.Access;

/// <summary>
/// One line per request, in place of the host's own "Request starting" lines (silenced in <see cref="AccessServices"/>),
/// which print the query as sent, tokens and keys included. Here their values are replaced by "***".
/// </summary>
public sealed class RequestLog(RequestDelegate next, ILogger<RequestLog> logger)
{
    /// <summary>Query parameters that carry secrets: sign-in and share tokens, saved-view delete keys, hand-over codes.</summary>
    public static readonly string[] SecretParameters = ["token", "key", "code", "access_token"];

    public async Task InvokeAsync(HttpContext context)
    {
        var started = Stopwatch.GetTimestamp();
        try
        {
            await next(context);
        }
        finally
        {
            // Ordinary answers (tiles by the thousand a second, and 429s under a flood) go at Debug: a console line each
            // would cost more than serving them. Server errors, refusals worth a look and slow answers stay visible.
            var elapsed = Stopwatch.GetElapsedTime(started).TotalMilliseconds;
            var status = context.Response.StatusCode;
            var level = status >= 500 ? LogLevel.Warning
                : elapsed >= SlowMilliseconds || (status >= 400 && status != StatusCodes.Status429TooManyRequests) ? LogLevel.Information
                : LogLevel.Debug;
            if (logger.IsEnabled(level))
                logger.Log(level, "{Method} {Path}{Query} answered {Status} in {Milliseconds:0.0} ms", context.Request.Method,
                    context.Request.Path.Value, Redacted(context.Request.QueryString), status, elapsed);
        }
    }

    private const double SlowMilliseconds = 1000;

    public static string Redacted(QueryString query)
    {
        if (!query.HasValue) return "";
        var parts = query.Value!.TrimStart('?').Split('&');
        for (var i = 0; i < parts.Length; i++)
        {
            var equals = parts[i].IndexOf('=', StringComparison.Ordinal);
            var name = Uri.UnescapeDataString(equals < 0 ? parts[i] : parts[i][..equals]);
            if (SecretParameters.Contains(name, StringComparer.OrdinalIgnoreCase)) parts[i] = (equals < 0 ? parts[i] : parts[i][..equals]) + "=***";
        }
        return "?" + string.Join('&', parts);
    }
}
