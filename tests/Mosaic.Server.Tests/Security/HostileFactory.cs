using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Mvc.Testing;

namespace Mosaic.Server.Tests.Security;

/// <summary>The real server on its own data, cache and state folders, with extra command-line settings.</summary>
public sealed class HostileFactory(string dataDirectory, string cacheDirectory, string stateDirectory, IReadOnlyDictionary<string, string> settings)
    : WebApplicationFactory<Program>
{
    protected override void ConfigureWebHost(IWebHostBuilder builder)
    {
        builder.UseSetting("data", dataDirectory);
        builder.UseSetting("cache", cacheDirectory);
        builder.UseSetting("state", stateDirectory);
        foreach (var (name, value) in settings) builder.UseSetting(name, value);
    }
}
