using StackExchange.Redis;

namespace Mosaic.Server.Redis;

/// <summary>Reads the --redis value into client options that keep the server up while Redis is not.</summary>
public static class RedisConfiguration
{
    /// <summary>
    /// <paramref name="text"/> is <c>host:port</c>, several of them comma-separated, then optional
    /// <c>name=value</c> options (password, ssl, connectTimeout...). Throws <see cref="ArgumentException"/> naming the
    /// option when it cannot be read.
    /// </summary>
    public static ConfigurationOptions Parse(string text)
    {
        if (string.IsNullOrWhiteSpace(text))
            throw new ArgumentException("--redis needs host:port (for example 127.0.0.1:6379), optionally followed by ,name=value options.");
        ConfigurationOptions options;
        try
        {
            options = ConfigurationOptions.Parse(text.Trim());
        }
        catch (Exception e) when (e is ArgumentException or FormatException or RedisConnectionException)
        {
            // The value is not echoed: it may carry a password.
            throw new ArgumentException($"--redis is not a Redis address list with options: {e.Message}", e);
        }
        if (options.EndPoints.Count == 0)
            throw new ArgumentException("--redis names no host:port; give at least one, for example 127.0.0.1:6379.");

        // Start and serve without Redis: connect in the background and keep retrying.
        options.AbortOnConnectFail = false;
        // While disconnected, fail a command at once rather than queueing it: callers fall back to local work.
        options.BacklogPolicy = BacklogPolicy.FailFast;
        // Come back within about a second of Redis returning, rather than after an exponential back-off.
        options.ReconnectRetryPolicy = new LinearRetry(1000);
        options.ClientName ??= "mosaic";
        return options;
    }
}
