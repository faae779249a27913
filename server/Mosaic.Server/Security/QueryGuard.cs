namespace Mosaic.Server.Security;

/// <summary>
/// Checks the shape of an API query before any endpoint parses it: each parameter given once, names and values of
/// bounded length, no control characters. An endpoint binding a repeated parameter would see its values joined by
/// commas and could misread them, so a repeat is refused outright. Page addresses (the viewer's links) are not API
/// queries and pass untouched.
/// </summary>
public sealed class QueryGuard(RequestDelegate next)
{
    public const int MaxParameters = 64;
    public const int MaxNameLength = 64;
    public const int MaxValueLength = 2048;

    public Task InvokeAsync(HttpContext context)
    {
        var request = context.Request;
        if (!request.QueryString.HasValue || !IsApi(request.Path)) return next(context);
        var query = request.Query;
        if (query.Count > MaxParameters)
            return Refuse(context, "query", $"The query has {query.Count} parameters; at most {MaxParameters} are read.");
        foreach (var (name, values) in query)
        {
            var shown = Shown(name);
            if (name.Length > MaxNameLength || HasControl(name))
                return Refuse(context, shown, $"'{shown}' is not a parameter name: names are at most {MaxNameLength} printable characters.");
            if (values.Count > 1)
                return Refuse(context, shown, $"'{shown}' is given {values.Count} times; give each parameter once.");
            var value = values.ToString();
            if (value.Length > MaxValueLength)
                return Refuse(context, shown, $"'{shown}' is {value.Length} characters long; at most {MaxValueLength} are read.");
            if (HasControl(value))
                return Refuse(context, shown, $"'{shown}' holds a control character (such as NUL); values are printable text.");
        }
        return next(context);
    }

    private static bool IsApi(PathString path) =>
        path.StartsWithSegments("/api", StringComparison.OrdinalIgnoreCase) || path.StartsWithSegments("/tiles", StringComparison.OrdinalIgnoreCase)
        || path.StartsWithSegments("/v", StringComparison.OrdinalIgnoreCase);

    private static bool HasControl(string text)
    {
        foreach (var c in text)
            if (char.IsControl(c)) return true;
        return false;
    }

    /// <summary>A name fit to echo: cut short, control characters made visible.</summary>
    private static string Shown(string name)
    {
        var cut = name.Length > MaxNameLength ? name[..MaxNameLength] + "…" : name;
        return string.Create(cut.Length, cut, (span, source) =>
        {
            for (var i = 0; i < source.Length; i++) span[i] = char.IsControl(source[i]) ? '\uFFFD' : source[i];
        });
    }

    private static Task Refuse(HttpContext context, string parameter, string detail) =>
        RequestProblem.WriteAsync(context, StatusCodes.Status400BadRequest, $"Invalid parameter '{parameter}'", detail, parameter).AsTask();
}
