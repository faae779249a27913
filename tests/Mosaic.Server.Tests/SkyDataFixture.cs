using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Server.Tests;

/// <summary>
/// Fields with celestial WCS written by astropy.io.fits (Debian python3-astropy) — a rotated TAN, a TAN-SIP, one
/// across RA = 0, one holding the north pole, Galactic axes, a four-chip camera frame with gaps, one without WCS and
/// one with a projection we do not support — and what astropy.wcs / astropy.coordinates make of them (one run of
/// Reference/sky_fixture.py).
/// </summary>
public sealed class SkyDataFixture : IDisposable
{
    public SkyDataFixture()
    {
        Root = Path.Combine(Path.GetTempPath(), $"mosaic-sky-tests-{Guid.NewGuid():N}");
        DataDirectory = Path.Combine(Root, "data");
        Directory.CreateDirectory(DataDirectory);
        var json = DebianPython.RunFile(Script("sky_fixture.py"), [DataDirectory]);
        Reference = JsonDocument.Parse(json);
        Factory = new MosaicFactory(DataDirectory, Path.Combine(Root, "cache"));
        Client = Factory.CreateClient();
    }

    public string Root { get; }

    public string DataDirectory { get; }

    /// <summary>What astropy computed; see Reference/sky_fixture.py for the layout.</summary>
    public JsonDocument Reference { get; }

    public MosaicFactory Factory { get; }

    public HttpClient Client { get; }

    public JsonElement Ref => Reference.RootElement;

    public static string Script(string name) => Path.Combine(AppContext.BaseDirectory, "Reference", name);

    public void Dispose()
    {
        Client.Dispose();
        Factory.Dispose();
        Reference.Dispose();
        try { Directory.Delete(Root, recursive: true); } catch (IOException) { }
    }
}
