namespace Mosaic.Server.Access;

/// <summary>
/// Browsers send Origin on WebSocket and script requests and let any page open a WebSocket to any server, so a hub
/// connection is refused unless its Origin is this server's own or listed in --allowed-origins. A request without
/// Origin comes from a program, not a page, and is let through (tokens still apply).
/// </summary>
public static class OriginCheck
{
    public static bool IsAllowed(HttpRequest request, AccessOptions options)
    {
        ArgumentNullException.ThrowIfNull(request);
        var origin = request.Headers.Origin.ToString();
        if (origin.Length == 0) return true;
        var own = $"{request.Scheme}://{request.Host.Value}";
        return string.Equals(origin, own, StringComparison.OrdinalIgnoreCase) || options.AllowedOrigins.Contains(origin);
    }
}
