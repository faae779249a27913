using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Mvc.Testing;

namespace Mosaic.Server.Tests.Views;

/// <summary>The real server in memory on given data, cache and state folders (and optionally a cutout limit), as --data, --cache, --state and --cutout-limit set them.</summary>
public sealed class StateFactory(string dataDirectory, string cacheDirectory, string stateDirectory, long? cutoutLimit = null) : WebApplicationFactory<Program>
{
    protected override void ConfigureWebHost(IWebHostBuilder builder)
    {
        builder.UseSetting("data", dataDirectory);
        builder.UseSetting("cache", cacheDirectory);
        builder.UseSetting("state", stateDirectory);
        if (cutoutLimit is { } limit) builder.UseSetting("cutout-limit", limit.ToString(System.Globalization.CultureInfo.InvariantCulture));
    }

    public HttpClient CreateClientWithoutRedirects() => CreateClient(new WebApplicationFactoryClientOptions { AllowAutoRedirect = false });
}
