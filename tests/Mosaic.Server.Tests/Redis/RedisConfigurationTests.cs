using Mosaic.Server.Redis;

namespace Mosaic.Server.Tests.Redis;

/// <summary>
/// The --redis value is StackExchange.Redis's configuration string ("host:port,name=value", from that library's
/// Configuration documentation, from memory); what Mosaic adds is a clear error and the settings that keep a server
/// up while Redis is not.
/// </summary>
public sealed class RedisConfigurationTests
{
    [Theory]
    [InlineData("")]
    [InlineData("   ")]
    [InlineData("password=secret")]
    [InlineData("127.0.0.1:6379,nosuchoption=1")]
    public void A_value_that_names_no_server_or_an_unknown_option_is_a_clear_argument_error(string text)
    {
        var error = Assert.Throws<ArgumentException>(() => RedisConfiguration.Parse(text));
        Assert.Contains("--redis", error.Message);
        Assert.DoesNotContain("secret", error.Message);
    }

    [Fact]
    public void Several_servers_and_options_are_read_and_start_up_never_waits_for_Redis()
    {
        var options = RedisConfiguration.Parse("10.0.0.5:6380,10.0.0.6:6381,abortConnect=true,connectTimeout=2500");
        Assert.Equal(["10.0.0.5:6380", "10.0.0.6:6381"], options.EndPoints.Select(e => e.ToString()));
        Assert.Equal(2500, options.ConnectTimeout);
        // Overridden even when asked for: the server must start and serve while Redis is down.
        Assert.False(options.AbortOnConnectFail);
    }
}
