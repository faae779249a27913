using System.Net.Http.Json;
using System.Text.Json;
using Microsoft.Extensions.DependencyInjection;
using Mosaic.Server.Fields;
using Mosaic.Testing;

namespace Mosaic.Server.Tests;

/// <summary>
/// A camera field written by astropy.io.fits (Debian python3-astropy; Reference/canvas_fixture.py): band r with three
/// TAN-SIP chips in a row with gaps and a fourth chip without WCS, band g with two chips on another pixel grid
/// (other sizes, scale, turns and distortion), a star at one sky position in both; and a field whose chips have no
/// WCS at all. Once the server has made its canvas and built every pyramid, astropy.wcs is given the canvas header
/// and computes the reference: canvas pixel → sky → chip pixel, the chip values, and the resampled values by the
/// documented method in numpy.
/// </summary>
public sealed class CanvasDataFixture : IAsyncLifetime
{
    public string Root { get; } = Path.Combine(Path.GetTempPath(), $"mosaic-canvas-tests-{Guid.NewGuid():N}");

    public string DataDirectory => Path.Combine(Root, "data");

    public MosaicFactory Factory { get; private set; } = null!;

    public HttpClient Client { get; private set; } = null!;

    /// <summary>What astropy computed with the server's canvas header; see Reference/canvas_fixture.py for the layout.</summary>
    public JsonElement Ref { get; private set; }

    /// <summary>The field listing of "camera" once every pyramid, canvases included, is ready.</summary>
    public JsonElement Camera { get; private set; }

    public async Task InitializeAsync()
    {
        Directory.CreateDirectory(DataDirectory);
        DebianPython.RunFile(SkyDataFixture.Script("canvas_fixture.py"), ["write", DataDirectory]);
        Factory = new MosaicFactory(DataDirectory, Path.Combine(Root, "cache"));
        Client = Factory.CreateClient();
        Camera = await WaitForCanvasesAsync(Client, "camera");

        // The canvas header the server made, as astropy is to read it.
        var catalog = Factory.Services.GetRequiredService<FieldCatalog>();
        var canvas = catalog.Get("camera").ResolveBand("r").ResolveHdu("canvas");
        var cards = canvas.Hdu.Header.Cards.Where(c => !c.IsCommentary && c.Value is not null)
            .ToDictionary(c => c.Keyword, c => c.Value);
        var json = DebianPython.RunFile(SkyDataFixture.Script("canvas_fixture.py"), ["reference", DataDirectory, JsonSerializer.Serialize(cards)]);
        Ref = JsonDocument.Parse(json).RootElement.Clone();
    }

    /// <summary>Polls the field until every chip pyramid and every band's canvas pyramid is ready; returns the listing.</summary>
    public static async Task<JsonElement> WaitForCanvasesAsync(HttpClient client, string field)
    {
        var deadline = DateTime.UtcNow + TimeSpan.FromSeconds(90);
        while (true)
        {
            var doc = await client.GetFromJsonAsync<JsonElement>($"/api/fields/{field}");
            var bands = doc.GetProperty("bands").EnumerateArray().ToList();
            var states = bands.SelectMany(b => b.GetProperty("hdus").EnumerateArray()).Select(h => h.GetProperty("pyramid").GetProperty("state").GetString())
                .Concat(bands.Where(b => b.GetProperty("canvas").ValueKind == JsonValueKind.Object)
                    .Select(b => b.GetProperty("canvas").GetProperty("pyramid").GetProperty("state").GetString())).ToList();
            if (states.Count > 0 && states.All(s => s == "ready")) return doc;
            if (states.Contains("failed")) throw new InvalidOperationException($"a pyramid of {field} failed: {doc}");
            if (DateTime.UtcNow > deadline) throw new TimeoutException($"pyramids of {field} not ready: {doc}");
            await Task.Delay(50);
        }
    }

    public Task DisposeAsync()
    {
        Client?.Dispose();
        Factory?.Dispose();
        try { Directory.Delete(Root, recursive: true); } catch (IOException) { }
        return Task.CompletedTask;
    }
}
