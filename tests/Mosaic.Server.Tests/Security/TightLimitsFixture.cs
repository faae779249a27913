namespace Mosaic.Server.Tests.Security;

/// <summary>The hostile data folder with a burst of 3 expensive requests per client and 1 a second after that.</summary>
public sealed class TightLimitsFixture() : HostileDataFixture(new Dictionary<string, string>
{
    ["expensive-burst"] = Burst.ToString(System.Globalization.CultureInfo.InvariantCulture),
    ["expensive-rate"] = "1",
})
{
    public const int Burst = 3;
}
