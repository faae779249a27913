using System.Reflection;
using System.Runtime.ExceptionServices;

namespace Mosaic.Server.Redis;

/// <summary>Forwards a proxied call to the real object, rethrowing what it threw rather than reflection's wrapper.</summary>
internal static class ProxyCall
{
    public static object? Forward(MethodInfo method, object target, object?[]? args)
    {
        try
        {
            return method.Invoke(target, args);
        }
        catch (TargetInvocationException e) when (e.InnerException is not null)
        {
            ExceptionDispatchInfo.Throw(e.InnerException);
            throw;
        }
    }
}
