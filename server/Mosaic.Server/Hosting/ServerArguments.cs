using Mosaic.Server.Access;

namespace Mosaic.Server.Hosting;

/// <summary>
/// The server's command line checked before the host reads it, and option errors reported as one line. The host's
/// configuration takes any <c>--name value</c>, so a misspelt option (<c>--port</c> for <c>--urls</c>, <c>--tile-mem</c>)
/// would otherwise be ignored without a word and the server would start with the default.
/// </summary>
public static class ServerArguments
{
    /// <summary>Exit code for a command line the server cannot start with: 2, as command-line tools commonly exit on a usage error.</summary>
    public const int UsageExitCode = 2;

    /// <summary>Our options (README, "Serving your own data").</summary>
    public static IReadOnlyList<string> Options { get; } =
    [
        "data", "cache", "state", "demo-preset", "urls", "cutout-limit", "redis", "heap-limit-mb",
        "access-token-file", "anonymous", "private-fields", "allowed-origins",
        "tile-memory-mb", "tile-disk-mb", "render-threads", "render-queue",
        "expensive-rate", "expensive-burst", "expensive-concurrency", "render-timeout",
    ];

    // The generic host's own command-line keys (ASP.NET Core host configuration), which its test host passes too.
    private static readonly HashSet<string> HostKeys = new(StringComparer.OrdinalIgnoreCase)
    {
        "environment", "contentRoot", "applicationName", "webroot", "http_ports", "https_ports", "detailedErrors",
        "hostingStartupAssemblies", "hostingStartupExcludeAssemblies", "preventHostingStartup", "shutdownTimeoutSeconds",
        "captureStartupErrors", "suppressStatusMessages",
    };

    // Words people try for the listening address, which is --urls http://host:port.
    private static readonly HashSet<string> AddressWords = new(StringComparer.OrdinalIgnoreCase) { "port", "ports", "host", "listen", "bind", "address" };

    /// <summary>
    /// What is wrong with the command line, or null. Names with a colon are configuration paths (<c>--Logging:LogLevel:Default</c>)
    /// and pass; so does anything after a bare <c>--</c>.
    /// </summary>
    public static string? Problem(IReadOnlyList<string> args)
    {
        ArgumentNullException.ThrowIfNull(args);
        for (var i = 0; i < args.Count; i++)
        {
            var argument = args[i];
            if (argument == "--") return null;
            var name = argument.StartsWith("--", StringComparison.Ordinal) ? argument[2..]
                : argument.StartsWith('/') || !argument.StartsWith('-') ? null : argument[1..];
            if (name is null)
            {
                if (i == 0 || !IsName(args[i - 1])) return $"'{argument}' is not an option: options are --name value (README, \"Serving your own data\").";
                continue;
            }
            var equals = name.IndexOf('=');
            var key = equals >= 0 ? name[..equals] : name;
            if (key.Contains(':') || HostKeys.Contains(key) || Options.Contains(key, StringComparer.OrdinalIgnoreCase))
            {
                if (equals < 0 && (i + 1 == args.Count || args[i + 1].StartsWith("--", StringComparison.Ordinal)))
                    return $"option '{argument}' needs a value: {argument} VALUE or {argument}=VALUE.";
                continue;
            }
            var near = AddressWords.Contains(key) ? ["urls"]
                : Options.Where(o => o.StartsWith(key.Split('-')[0], StringComparison.OrdinalIgnoreCase)).ToList();
            return $"unknown option '{argument}'" + (near.Count > 0 ? $" (did you mean {string.Join(" or ", near.Select(o => "--" + o))}?)" : "")
                + $"; the options are {string.Join(", ", Options.Select(o => "--" + o))}.";
        }
        return null;
    }

    /// <summary>True for an option error (the option named first, as every option check here words it), which deserves one line and no stack trace.</summary>
    public static bool IsOptionError(Exception exception) => exception is AccessOptionException
        || exception is ArgumentException { Message: var message } && message.StartsWith("--", StringComparison.Ordinal);

    /// <summary>Writes the problem to standard error and gives the exit code.</summary>
    public static int Fail(string problem)
    {
        Console.Error.WriteLine($"mosaic: {problem}");
        return UsageExitCode;
    }

    // A value follows a name unless the name carries it (--name=value).
    private static bool IsName(string argument) => argument.StartsWith('-') && !argument.Contains('=') && argument != "-";
}
