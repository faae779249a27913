using System.Text.Json;
using Mosaic.Fits.Tests.Support;

namespace Mosaic.Fits.Tests.Astropy;

/// <summary>
/// FITS files written by astropy.io.fits (Debian python3-astropy) into a temp folder, with a JSON of what astropy
/// reads back from each: the outside reference the reader is compared against.
/// </summary>
public sealed class AstropyReferenceFiles : IDisposable
{
    private readonly TempFolder _folder = new();
    private readonly JsonDocument _expected;

    public AstropyReferenceFiles()
    {
        Support.Astropy.Run("make_reference_files.py", _folder.Path);
        _expected = JsonDocument.Parse(File.ReadAllText(_folder.File("expected.json")));
    }

    public string PathOf(string name) => _folder.File(name);

    /// <summary>The HDUs astropy read from the file.</summary>
    public JsonElement Hdus(string name) => _expected.RootElement.GetProperty(name);

    public IEnumerable<string> Names => _expected.RootElement.EnumerateObject().Select(p => p.Name);

    public void Dispose()
    {
        _expected.Dispose();
        _folder.Dispose();
    }
}
