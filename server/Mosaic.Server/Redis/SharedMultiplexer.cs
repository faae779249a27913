using System.Reflection;
using StackExchange.Redis;

namespace Mosaic.Server.Redis;

/// <summary>
/// The shared multiplexer as handed to the distributed cache and the SignalR backplane: everything passes through
/// except closing and disposing, which belong to <see cref="RedisConnection"/>, and the subscriber, which comes
/// wrapped (<see cref="SharedSubscriber"/>). Those libraries close the
/// connection they were given when they are disposed, and the one disposed first would cut it off for the others.
/// </summary>
public class SharedMultiplexer : DispatchProxy
{
    private IConnectionMultiplexer _inner = null!;

    public static IConnectionMultiplexer Over(IConnectionMultiplexer inner)
    {
        var proxy = Create<IConnectionMultiplexer, SharedMultiplexer>();
        ((SharedMultiplexer)(object)proxy)._inner = inner;
        return proxy;
    }

    protected override object? Invoke(MethodInfo? targetMethod, object?[]? args)
    {
        ArgumentNullException.ThrowIfNull(targetMethod);
        switch (targetMethod.Name)
        {
            case nameof(IDisposable.Dispose):
            case nameof(IConnectionMultiplexer.Close):
                return null;
            case nameof(IAsyncDisposable.DisposeAsync):
                return ValueTask.CompletedTask;
            case nameof(IConnectionMultiplexer.CloseAsync):
                return Task.CompletedTask;
        }
        var result = ProxyCall.Forward(targetMethod, _inner, args);
        return result is ISubscriber subscriber ? SharedSubscriber.Over(subscriber) : result;
    }
}
