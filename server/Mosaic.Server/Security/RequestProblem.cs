using System.Globalization;
using Microsoft.AspNetCore.Mvc;

namespace Mosaic.Server.Security;

/// <summary>Problem details written by middleware that answers before any endpoint runs (limits, timeouts, query checks).</summary>
internal static class RequestProblem
{
    public static async ValueTask WriteAsync(HttpContext context, int status, string title, string detail,
        string? parameter = null, TimeSpan? retryAfter = null)
    {
        var response = context.Response;
        response.StatusCode = status;
        response.Headers.CacheControl = "no-store";
        if (retryAfter is { } wait)
            response.Headers.RetryAfter = Math.Max(1, (int)Math.Ceiling(wait.TotalSeconds)).ToString(CultureInfo.InvariantCulture);
        var problem = new ProblemDetails { Status = status, Title = title, Detail = detail };
        if (parameter is not null) problem.Extensions["parameter"] = parameter;
        var writer = context.RequestServices.GetRequiredService<IProblemDetailsService>();
        if (!await writer.TryWriteAsync(new ProblemDetailsContext { HttpContext = context, ProblemDetails = problem }))
            await response.WriteAsync(detail);
    }
}
