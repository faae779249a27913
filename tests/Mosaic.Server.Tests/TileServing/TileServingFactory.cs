using Microsoft.AspNetCore.Hosting;
using Microsoft.AspNetCore.Mvc.Testing;

namespace Mosaic.Server.Tests.TileServing;

/// <summary>The real server in memory on a data and cache folder, with extra command-line settings.</summary>
public sealed class TileServingFactory(string dataDirectory, string cacheDirectory, params (string Name, string Value)[] settings)
    : WebApplicationFactory<Program>
{
    protected override void ConfigureWebHost(IWebHostBuilder builder)
    {
        builder.UseSetting("data", dataDirectory);
        builder.UseSetting("cache", cacheDirectory);
        foreach (var (name, value) in settings) builder.UseSetting(name, value);
    }
}
