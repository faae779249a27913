using Microsoft.AspNetCore.Hosting;
using Microsoft.Extensions.DependencyInjection;

namespace Mosaic.Server.Tests.ClientFiles;

/// <summary>The real server in memory on an empty data folder: enough to serve the client's page and files.</summary>
public sealed class ClientSiteFixture : IDisposable
{
    private readonly string _root = Directory.CreateTempSubdirectory("mosaic-client-files-").FullName;

    public ClientSiteFixture()
    {
        Directory.CreateDirectory(Path.Combine(_root, "data"));
        Factory = new MosaicFactory(Path.Combine(_root, "data"), Path.Combine(_root, "cache"));
        Client = Factory.CreateClient();
        WebRoot = Factory.Services.GetRequiredService<IWebHostEnvironment>().WebRootPath;
    }

    public MosaicFactory Factory { get; }

    public HttpClient Client { get; }

    /// <summary>The folder the server sends the client's files from (the build copies client/src there).</summary>
    public string WebRoot { get; }

    public void Dispose()
    {
        Client.Dispose();
        Factory.Dispose();
        try
        {
            Directory.Delete(_root, recursive: true);
        }
        catch (IOException)
        {
            // A file still held open by the stopping server; the temp folder is cleaned up later.
        }
    }
}
