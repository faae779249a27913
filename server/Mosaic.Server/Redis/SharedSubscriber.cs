using System.Reflection;
using StackExchange.Redis;

namespace Mosaic.Server.Redis;

/// <summary>
/// The shared multiplexer's subscriber as handed to the SignalR backplane: everything passes through, except that
/// unsubscribing everything once <see cref="RedisConnection"/> has closed the connection is a no-op, since the
/// subscriptions went with it. The container disposes the connection and the backplane in an order it chooses.
/// </summary>
public class SharedSubscriber : DispatchProxy
{
    private ISubscriber _inner = null!;

    public static ISubscriber Over(ISubscriber inner)
    {
        var proxy = Create<ISubscriber, SharedSubscriber>();
        ((SharedSubscriber)(object)proxy)._inner = inner;
        return proxy;
    }

    protected override object? Invoke(MethodInfo? targetMethod, object?[]? args)
    {
        ArgumentNullException.ThrowIfNull(targetMethod);
        try
        {
            var result = ProxyCall.Forward(targetMethod, _inner, args);
            return targetMethod.Name == nameof(ISubscriber.UnsubscribeAllAsync) && result is Task task ? IgnoreClosed(task) : result;
        }
        catch (ObjectDisposedException) when (targetMethod.Name == nameof(ISubscriber.UnsubscribeAll))
        {
            return null;
        }
    }

    private static async Task IgnoreClosed(Task unsubscribing)
    {
        try
        {
            await unsubscribing.ConfigureAwait(false);
        }
        catch (ObjectDisposedException)
        {
        }
    }
}
