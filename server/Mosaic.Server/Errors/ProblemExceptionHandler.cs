using Microsoft.AspNetCore.Diagnostics;
using Mosaic.Fits;
using Mosaic.Wcs.Coordinates;

namespace Mosaic.Server.Errors;

/// <summary>The one place where exceptions become status codes and RFC 9457 problem details.</summary>
public sealed class ProblemExceptionHandler(IProblemDetailsService problemDetails, ILogger<ProblemExceptionHandler> logger) : IExceptionHandler
{
    public async ValueTask<bool> TryHandleAsync(HttpContext context, Exception exception, CancellationToken cancellationToken)
    {
        var (status, title, detail, extensions) = Classify(exception);
        if (status >= 500 && exception is not PyramidNotReadyException)
            logger.LogError(exception, "Request {Path} failed", context.Request.Path);

        context.Response.StatusCode = status;
        context.Response.Headers.CacheControl = "no-store";
        if (exception is PyramidNotReadyException notReady)
            context.Response.Headers.RetryAfter = notReady.RetryAfterSeconds.ToString(System.Globalization.CultureInfo.InvariantCulture);
        else if (exception is Mosaic.TileCache.Throttling.RenderQueueFullException full)
            context.Response.Headers.RetryAfter = full.RetryAfterSeconds.ToString(System.Globalization.CultureInfo.InvariantCulture);

        var problem = new Microsoft.AspNetCore.Mvc.ProblemDetails { Status = status, Title = title, Detail = detail };
        foreach (var (key, value) in extensions) problem.Extensions[key] = value;
        return await problemDetails.TryWriteAsync(new ProblemDetailsContext { HttpContext = context, ProblemDetails = problem, Exception = exception });
    }

    private static (int Status, string Title, string Detail, Dictionary<string, object?> Extensions) Classify(Exception exception)
    {
        var extensions = new Dictionary<string, object?>();
        switch (exception)
        {
            case PyramidNotReadyException e:
                extensions["progress"] = e.Progress;
                return (e.Status, e.Title, e.Message, extensions);
            case Mosaic.TileCache.Throttling.RenderQueueFullException e:
                // RFC 6585 section 4: 429 Too Many Requests, with Retry-After saying how long to wait.
                extensions["retryAfterSeconds"] = e.RetryAfterSeconds;
                return (StatusCodes.Status429TooManyRequests, "Too many renders", e.Message, extensions);
            case MosaicRequestException e:
                if (e.Parameter is not null) extensions["parameter"] = e.Parameter;
                return (e.Status, e.Title, e.Message, extensions);
            case FitsFormatException e:
                extensions["file"] = Path.GetFileName(e.FilePath);
                if (e.HduIndex is int hdu) extensions["hdu"] = hdu;
                if (e.Keyword is not null) extensions["keyword"] = e.Keyword;
                return (StatusCodes.Status422UnprocessableEntity, "Unreadable FITS data", e.Message, extensions);
            case PositionFormatException e:
                // Typed sky positions arrive only in the 'position' parameter.
                extensions["parameter"] = "position";
                return (StatusCodes.Status400BadRequest, "Invalid parameter 'position'", $"'position' is not a sky position: {e.Message}.", extensions);
            case SkyUnavailableException e:
                if (e.Parameter is not null) extensions["parameter"] = e.Parameter;
                if (e.SkyError is not null) extensions["skyError"] = e.SkyError;
                return (StatusCodes.Status422UnprocessableEntity, "No sky coordinates", e.Message, extensions);
            case BadHttpRequestException e:
                return (e.StatusCode, "Bad request", e.Message, extensions);
            case OperationCanceledException:
                return (499, "Request cancelled", "The client went away.", extensions);
            default:
                return (StatusCodes.Status500InternalServerError, "Internal error", "The server failed to answer this request; the error is in its log.", extensions);
        }
    }
}
