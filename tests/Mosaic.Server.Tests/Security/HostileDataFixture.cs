using Mosaic.Testing;

namespace Mosaic.Server.Tests.Security;

/// <summary>
/// A data folder written by astropy.io.fits (Debian python3-astropy) with one honest field, a folder field, and
/// symbolic links that point out of the data folder (a file, a folder, and a band file inside the folder field); the
/// targets outside carry a marker that must never be served. The server runs on Kestrel on a loopback port, so raw
/// request targets reach the real HTTP parser; the rate limits are the defaults unless a test's own factory says so.
/// </summary>
public class HostileDataFixture : IDisposable
{
    public const string Secret = "OUTSIDE-THE-DATA-FOLDER";

    public const int Width = 40;
    public const int Height = 30;

    private const string WriterScript = """
import os, sys
import numpy as np
from astropy.io import fits
root, data, outside = sys.argv[1], sys.argv[2], sys.argv[3]
os.makedirs(os.path.join(data, "cam"), exist_ok=True)
os.makedirs(os.path.join(outside, "hidden"), exist_ok=True)

def image(value, secret=False):
    y, x = np.mgrid[0:30, 0:40]
    hdu = fits.PrimaryHDU((value + x + 100 * y).astype(np.float32))
    h = hdu.header
    h["CTYPE1"], h["CTYPE2"] = "RA---TAN", "DEC--TAN"
    h["CRPIX1"], h["CRPIX2"] = 20.5, 15.5
    h["CRVAL1"], h["CRVAL2"] = 150.0, 2.0
    h["CDELT1"], h["CDELT2"] = -0.0002777778, 0.0002777778
    h["CUNIT1"], h["CUNIT2"] = "deg", "deg"
    if secret: h["COMMENT"] = sys.argv[4]
    return hdu

image(1.0).writeto(os.path.join(data, "open.fits"))
image(2.0).writeto(os.path.join(data, "cam", "cam_r.fits"))
image(3.0, True).writeto(os.path.join(outside, "secret.fits"))
image(4.0, True).writeto(os.path.join(outside, "hidden", "hidden_r.fits"))
print("ok")
""";

    public HostileDataFixture() : this(new Dictionary<string, string>())
    {
    }

    /// <param name="settings">Command-line settings for the server (such as expensive-burst), on top of data and cache.</param>
    protected HostileDataFixture(IReadOnlyDictionary<string, string> settings)
    {
        Root = Path.Combine(Path.GetTempPath(), $"mosaic-hostile-{Guid.NewGuid():N}");
        DataDirectory = Path.Combine(Root, "data");
        var outside = Path.Combine(Root, "outside");
        Directory.CreateDirectory(DataDirectory);
        Directory.CreateDirectory(outside);
        DebianPython.RunCode(WriterScript, [Root, DataDirectory, outside, Secret]);
        // Links inside the data folder whose targets lie outside it.
        File.CreateSymbolicLink(Path.Combine(DataDirectory, "leak.fits"), Path.Combine(outside, "secret.fits"));
        Directory.CreateSymbolicLink(Path.Combine(DataDirectory, "leakdir"), Path.Combine(outside, "hidden"));
        File.CreateSymbolicLink(Path.Combine(DataDirectory, "cam", "cam_x.fits"), Path.Combine(outside, "secret.fits"));
        // A relative link climbing out, as a careless "ln -s ../outside/secret.fits" would make.
        File.CreateSymbolicLink(Path.Combine(DataDirectory, "climb.fits"), Path.Combine("..", "outside", "secret.fits"));

        Factory = new HostileFactory(DataDirectory, Path.Combine(Root, "cache"), Path.Combine(Root, "state"), settings);
        Factory.UseKestrel(0);
        Factory.StartServer();
        Client = Factory.CreateClient();
        Port = Client.BaseAddress!.Port;
    }

    public string Root { get; }

    public string DataDirectory { get; }

    public HostileFactory Factory { get; }

    public HttpClient Client { get; }

    public int Port { get; }

    public void Dispose()
    {
        Dispose(true);
        GC.SuppressFinalize(this);
    }

    protected virtual void Dispose(bool disposing)
    {
        if (!disposing) return;
        Client.Dispose();
        Factory.Dispose();
        try { Directory.Delete(Root, recursive: true); } catch (IOException) { }
    }
}
