using System.Net;
using System.Threading.RateLimiting;
using Microsoft.AspNetCore.Http.Timeouts;
using Microsoft.AspNetCore.RateLimiting;

namespace Mosaic.Server.Security;

/// <summary>
/// Rate limits and timeouts for <see cref="ExpensiveRequest"/> endpoints: a token bucket per client IP (burst, then a
/// steady rate) chained with one concurrency cap over all clients, answering 429 with Retry-After; and a timeout that
/// stops a render with 504. Every other request passes through a no-op partition.
/// </summary>
public static class RequestLimitServices
{
    private const string Unlimited = "";

    public static IServiceCollection AddRequestLimits(this IServiceCollection services, RequestLimits limits)
    {
        ArgumentNullException.ThrowIfNull(limits);
        ThreadPoolFloor.Ensure(limits);
        services.AddSingleton(limits);
        services.AddRateLimiter(options =>
        {
            options.GlobalLimiter = PartitionedRateLimiter.CreateChained(PerClient(limits), AllClients(limits));
            options.OnRejected = (context, cancellationToken) => Reject(context, limits);
        });
        services.AddRequestTimeouts(options => options.AddPolicy(ExpensiveRequest.TimeoutPolicy, new RequestTimeoutPolicy
        {
            Timeout = limits.RenderTimeout,
            TimeoutStatusCode = StatusCodes.Status504GatewayTimeout,
            WriteTimeoutResponse = context => RequestProblem.WriteAsync(context, StatusCodes.Status504GatewayTimeout, "Request took too long",
                $"The request was stopped after {limits.RenderTimeout.TotalSeconds:0.###} s; ask for a smaller box or try again later.").AsTask(),
        }));
        return services;
    }

    private static PartitionedRateLimiter<HttpContext> PerClient(RequestLimits limits) =>
        PartitionedRateLimiter.Create<HttpContext, string>(context => IsExpensive(context)
            ? RateLimitPartition.GetTokenBucketLimiter(ClientKey(context), _ => new TokenBucketRateLimiterOptions
            {
                TokenLimit = limits.Burst,
                TokensPerPeriod = limits.PerSecond,
                ReplenishmentPeriod = TimeSpan.FromSeconds(1),
                QueueLimit = 0,
                AutoReplenishment = true,
            })
            : RateLimitPartition.GetNoLimiter(Unlimited));

    private static PartitionedRateLimiter<HttpContext> AllClients(RequestLimits limits) =>
        PartitionedRateLimiter.Create<HttpContext, string>(context => IsExpensive(context)
            ? RateLimitPartition.GetConcurrencyLimiter("all", _ => new ConcurrencyLimiterOptions
            {
                PermitLimit = limits.Concurrency,
                QueueLimit = limits.Queue,
                QueueProcessingOrder = QueueProcessingOrder.OldestFirst,
            })
            : RateLimitPartition.GetNoLimiter(Unlimited));

    private static bool IsExpensive(HttpContext context) =>
        context.GetEndpoint()?.Metadata.GetMetadata<ExpensiveRequest>() is { } expensive && expensive.Applies(context.Request);

    /// <summary>The peer's address; IPv4 seen through IPv6 counts as the same client.</summary>
    private static string ClientKey(HttpContext context) =>
        context.Connection.RemoteIpAddress is { } address
            ? (address.IsIPv4MappedToIPv6 ? address.MapToIPv4() : address).ToString()
            : IPAddress.None.ToString();

    private static ValueTask Reject(OnRejectedContext rejected, RequestLimits limits)
    {
        // The token bucket knows when its next token comes; the concurrency cap does not, so a second is suggested.
        var retryAfter = rejected.Lease.TryGetMetadata(MetadataName.RetryAfter, out var wait) ? wait : TimeSpan.FromSeconds(1);
        return RequestProblem.WriteAsync(rejected.HttpContext, StatusCodes.Status429TooManyRequests, "Too many requests",
            $"This server takes {limits.Burst} expensive requests in a burst from one client, then {limits.PerSecond} a second, and {limits.Concurrency} at a time overall (with {limits.Queue} waiting); try again in {Math.Max(1, Math.Ceiling(retryAfter.TotalSeconds))} s.",
            retryAfter: retryAfter);
    }
}
