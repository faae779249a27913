using Mosaic.Fits;
using Mosaic.Fits.Writing;

namespace Mosaic.Server.Tests.Views;

/// <summary>Two small fields, "alpha" and "beta", and a server on them with its own state folder.</summary>
public sealed class ViewsFixture : IDisposable
{
    public ViewsFixture()
    {
        Root = Path.Combine(Path.GetTempPath(), $"mosaic-views-tests-{Guid.NewGuid():N}");
        DataDirectory = Path.Combine(Root, "data");
        StateDirectory = Path.Combine(Root, "state");
        Directory.CreateDirectory(DataDirectory);
        WriteField("alpha");
        WriteField("beta");
        Factory = Start();
        Client = Factory.CreateClient();
    }

    public string Root { get; }

    public string DataDirectory { get; }

    public string StateDirectory { get; }

    public StateFactory Factory { get; }

    public HttpClient Client { get; }

    /// <summary>Another server on the same data and state folders (as after a restart).</summary>
    public StateFactory Start() => new(DataDirectory, Path.Combine(Root, "cache"), StateDirectory);

    private void WriteField(string name)
    {
        using var stream = File.Create(Path.Combine(DataDirectory, name + ".fits"));
        using var writer = new FitsWriter(stream);
        var pixels = new float[16 * 12];
        for (var i = 0; i < pixels.Length; i++) pixels[i] = i;
        writer.WriteFloatImage([new HeaderCard("BUNIT", "adu", null)], 16, 12, pixels);
    }

    public void Dispose()
    {
        Client.Dispose();
        Factory.Dispose();
        Microsoft.Data.Sqlite.SqliteConnection.ClearAllPools();
        try { Directory.Delete(Root, recursive: true); } catch (IOException) { }
    }
}
