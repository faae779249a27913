namespace Mosaic.Server.Tests.Access;

/// <summary>Without --urls the server listens on the loopback address only (127.0.0.1, RFC 1122 section 3.2.1.3), never on every interface.</summary>
public sealed class ListeningAddressTests(AccessFixture fixture) : IClassFixture<AccessFixture>
{
    [Fact]
    public async Task Without_urls_the_server_binds_loopback_only()
    {
        using var server = RealServer.Start(["--data", fixture.DataDirectory, "--cache", fixture.CacheDirectory, "--state", fixture.StateDirectory], chooseAddress: false);
        // Either it listens, or port 5000 is taken by something else on this machine: both lines name the address it chose.
        await server.WaitForOutputAsync(o => o.Contains("Now listening on", StringComparison.Ordinal) || o.Contains("Failed to bind", StringComparison.Ordinal), TimeSpan.FromSeconds(60));
        var output = server.Output;
        Assert.Contains("http://127.0.0.1:5000", output);
        Assert.DoesNotContain("0.0.0.0", output);
        Assert.DoesNotContain("[::]", output);
        Assert.DoesNotContain("http://*", output);
    }
}
