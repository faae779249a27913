namespace Mosaic.Server.Security;

public static class ExpensiveEndpoints
{
    /// <summary>Marks the endpoints as expensive: rate limited per client IP and under the render timeout.</summary>
    public static TBuilder Expensive<TBuilder>(this TBuilder builder, Func<HttpRequest, bool>? applies = null)
        where TBuilder : IEndpointConventionBuilder
    {
        builder.WithMetadata(new ExpensiveRequest(applies));
        builder.WithRequestTimeout(ExpensiveRequest.TimeoutPolicy);
        return builder;
    }
}
