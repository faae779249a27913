namespace Mosaic.Server.Tests.Security;

/// <summary>The hostile data folder with rate limits out of the way, for tests that send many expensive requests on purpose.</summary>
public sealed class GenerousLimitsFixture() : HostileDataFixture(new Dictionary<string, string>
{
    ["expensive-burst"] = "100000",
    ["expensive-rate"] = "100000",
});
