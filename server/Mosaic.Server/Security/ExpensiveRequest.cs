namespace Mosaic.Server.Security;

/// <summary>
/// Endpoint metadata: the request reads or renders many pixels, so it is rate limited per client and stopped after
/// <see cref="RequestLimits.RenderTimeout"/>. <see cref="Applies"/> lets an endpoint that is cheap for some queries
/// (statistics without a box) opt those out.
/// </summary>
public sealed class ExpensiveRequest(Func<HttpRequest, bool>? applies = null)
{
    public const string TimeoutPolicy = "mosaic-render";

    private readonly Func<HttpRequest, bool> _applies = applies ?? (_ => true);

    public bool Applies(HttpRequest request) => _applies(request);
}
