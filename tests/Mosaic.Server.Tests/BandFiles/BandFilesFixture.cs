using System.Text.Json;
using Microsoft.Extensions.DependencyInjection;
using Mosaic.Server.Fields;
using Mosaic.Testing;

namespace Mosaic.Server.Tests.BandFiles;

/// <summary>
/// Folders of single-chip files written by astropy.io.fits (Debian python3-astropy; Reference/band_files_fixture.py):
/// quad (bands r and g, four TAN-SIP chips each, one file per chip, FILTER in the headers), names (no FILTER: the
/// file-name rule; two files that are not FITS), mixed.fits (one file whose extensions have different FILTERs) and
/// patchy (a chip without WCS). Once the server has made quad's canvas, astropy.wcs is given the canvas header and
/// computes the reference: chip corners and centres on the canvas, sky positions to file and chip pixel.
/// </summary>
public sealed class BandFilesFixture : IAsyncLifetime
{
    public string Root { get; } = Path.Combine(Path.GetTempPath(), $"mosaic-band-files-{Guid.NewGuid():N}");

    public string DataDirectory => Path.Combine(Root, "data");

    public MosaicFactory Factory { get; private set; } = null!;

    public HttpClient Client { get; private set; } = null!;

    /// <summary>What astropy read while writing: pixel values and finite-pixel counts.</summary>
    public JsonElement Written { get; private set; }

    /// <summary>What astropy computed with the server's canvas header for quad.</summary>
    public JsonElement Ref { get; private set; }

    /// <summary>quad's listing once every pyramid, canvases included, is ready.</summary>
    public JsonElement Quad { get; private set; }

    public static string Script => SkyDataFixture.Script("band_files_fixture.py");

    public async Task InitializeAsync()
    {
        Directory.CreateDirectory(DataDirectory);
        Written = JsonDocument.Parse(DebianPython.RunFile(Script, ["write", DataDirectory])).RootElement.Clone();
        Factory = new MosaicFactory(DataDirectory, Path.Combine(Root, "cache"));
        Client = Factory.CreateClient();
        Quad = await CanvasDataFixture.WaitForCanvasesAsync(Client, "quad");
        foreach (var field in new[] { "names", "mixed", "patchy" })
            await CanvasDataFixture.WaitForCanvasesAsync(Client, field);

        var canvas = Factory.Services.GetRequiredService<FieldCatalog>().Get("quad").ResolveBand("r").ResolveHdu("canvas");
        var cards = canvas.Hdu.Header.Cards.Where(c => !c.IsCommentary && c.Value is not null).ToDictionary(c => c.Keyword, c => c.Value);
        Ref = JsonDocument.Parse(DebianPython.RunFile(Script, ["reference", DataDirectory, JsonSerializer.Serialize(cards)])).RootElement.Clone();
    }

    public JsonElement Band(JsonElement field, string name) =>
        field.GetProperty("bands").EnumerateArray().Single(b => b.GetProperty("name").GetString() == name);

    public Task DisposeAsync()
    {
        Client?.Dispose();
        Factory?.Dispose();
        try { Directory.Delete(Root, recursive: true); } catch (IOException) { }
        return Task.CompletedTask;
    }
}
