using System.Text.Json;
using Microsoft.Playwright;
using Mosaic.Browser.Tests.Viewer;

namespace Mosaic.Browser.Tests.Hosting;

/// <summary>
/// A data folder with the small synthetic demo field, a small synthetic frame without any WCS, a small file of three
/// chips of which one has no WCS, and one unreadable FITS file, the real server serving it, and Debian's Chromium driven by Playwright.
/// </summary>
public sealed class MosaicSite : IAsyncLifetime
{
    public const string DemoFieldId = "demo";
    public const string BrokenFieldFile = "broken.fits";
    /// <summary>A field of one small image whose header has no celestial WCS at all: pixels yes, sky no.</summary>
    public const string UnsolvedFieldId = "unsolved";
    /// <summary>A field of three chips in one file: two with a TAN WCS and a gap between them, one with no WCS.</summary>
    public const string PartlySolvedFieldId = "partly-solved";
    private const string Chromium = "/usr/bin/chromium";

    private readonly string _root = Path.Combine(Path.GetTempPath(), $"mosaic-browser-{Guid.NewGuid():N}");
    private ServerProcess? _server;
    private IPlaywright? _playwright;
    private IBrowser? _browser;
    private FieldInfo? _demo;

    public string DataDirectory => Path.Combine(_root, "data");

    /// <summary>The server's --state folder: saved views live here, across restarts.</summary>
    public string StateDirectory => Path.Combine(_root, "state");

    private string CacheDirectory => Path.Combine(_root, "cache");

    public Uri BaseAddress => Server.BaseAddress;

    public ServerProcess Server => _server ?? throw new InvalidOperationException("the site is not started");

    public FieldInfo Demo => _demo ?? throw new InvalidOperationException("the site is not started");

    public string BandFile(string band) => Path.Combine(DataDirectory, DemoFieldId, Demo.Band(band).File);

    /// <summary>The first HDU of a band with a NaN pixel (saturated stars are NaN in the demo field), as astropy finds it.</summary>
    public (HduInfo Hdu, int X, int Y) FirstMaskedPixel(string band)
    {
        var file = BandFile(band);
        var (hdu, masked) = Demo.Band(band).Hdus
            .Select(h => (Hdu: h, Pixel: Reference.AstropyFits.MaskedPixel(file, h.Index, margin: 4)))
            .FirstOrDefault(found => found.Pixel is not null);
        if (hdu is null || masked is null) throw new InvalidOperationException($"astropy finds no NaN pixel in any HDU of band {band}");
        return (hdu, masked.Value.X, masked.Value.Y);
    }

    /// <summary>A new empty folder for a separate server's --state.</summary>
    public string NewStateDirectory()
    {
        var folder = Path.Combine(_root, $"state-{Guid.NewGuid():N}");
        Directory.CreateDirectory(folder);
        return folder;
    }

    /// <summary>
    /// Another server on the same data and cache folders but its own --state folder, on <paramref name="address"/>
    /// (a free port when null), returned once the demo field's pyramids are ready there. Restart tests stop and
    /// start these, so the shared server stays up and warm for every other test.
    /// </summary>
    public async Task<ServerProcess> StartSeparateServerAsync(string stateDirectory, Uri? address = null)
    {
        var server = await ServerProcess.StartAsync(DataDirectory, CacheDirectory, stateDirectory, address);
        try
        {
            await WaitForPyramidsAsync(TimeSpan.FromMinutes(2), DemoFieldId, server.BaseAddress);
            return server;
        }
        catch
        {
            await server.DisposeAsync();
            throw;
        }
    }

    public HttpClient CreateHttpClient() => new() { BaseAddress = BaseAddress, Timeout = TimeSpan.FromSeconds(30) };

    public async Task InitializeAsync()
    {
        if (!File.Exists(Chromium))
            throw new InvalidOperationException($"{Chromium} is missing: apt-get install chromium");
        Directory.CreateDirectory(DataDirectory);
        await ServerProcess.GenerateDemoAsync(Path.Combine(DataDirectory, DemoFieldId), "small");
        // A file that claims to be FITS but is not: the field list must show it, with why it cannot be read.
        await File.WriteAllTextAsync(Path.Combine(DataDirectory, BrokenFieldFile), "This is not a FITS file: it has no SIMPLE card.\n");
        // Written by astropy.io.fits (Debian python3-astropy): noise about 100 adu, BUNIT, no WCS keywords.
        Mosaic.Testing.DebianPython.RunCode(
            """
            import sys
            import numpy as np
            from astropy.io import fits
            data = (100 + 5 * np.random.default_rng(7).standard_normal((48, 64))).astype(np.float32)
            header = fits.Header()
            header["BUNIT"] = "adu"
            fits.HDUList([fits.PrimaryHDU(), fits.ImageHDU(data, header=header, name="FRAME")]).writeto(sys.argv[1])
            """,
            [Path.Combine(DataDirectory, UnsolvedFieldId + ".fits")]);

        // Written by astropy.io.fits (Debian python3-astropy). Two 96 x 64 chips side by side on the sky, 10 pixels
        // apart (0.25"/px, north up, east left), and a third chip whose header has no WCS keywords at all.
        Mosaic.Testing.DebianPython.RunCode(
            """
            import sys
            import numpy as np
            from astropy.io import fits
            rng = np.random.default_rng(11)
            hdus = [fits.PrimaryHDU()]
            for name, crpix1 in (("CAM01", 102.0), ("CAM02", -4.0), ("CAM03", None)):
                data = (200 + 10 * rng.standard_normal((64, 96)) + np.arange(96)[None, :]).astype(np.float32)
                header = fits.Header()
                header["BUNIT"] = "adu"
                if crpix1 is not None:
                    header["CTYPE1"], header["CTYPE2"] = "RA---TAN", "DEC--TAN"
                    header["CRVAL1"], header["CRVAL2"] = 201.25, 33.5
                    header["CRPIX1"], header["CRPIX2"] = crpix1, 32.5
                    header["CD1_1"], header["CD1_2"] = -0.25 / 3600, 0.0
                    header["CD2_1"], header["CD2_2"] = 0.0, 0.25 / 3600
                    header["RADESYS"] = "ICRS"
                hdus.append(fits.ImageHDU(data, header=header, name=name))
            fits.HDUList(hdus).writeto(sys.argv[1])
            """,
            [Path.Combine(DataDirectory, PartlySolvedFieldId + ".fits")]);

        _server = await ServerProcess.StartAsync(DataDirectory, CacheDirectory, StateDirectory);
        _demo = await WaitForPyramidsAsync(TimeSpan.FromMinutes(3));

        _playwright = await Playwright.CreateAsync();
        _browser = await _playwright.Chromium.LaunchAsync(new BrowserTypeLaunchOptions
        {
            ExecutablePath = Chromium,
            Headless = true,
            Args = ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking",
                "--disable-component-update", "--disable-sync"],
        });
    }

    /// <summary>A fresh browser context (no shared history or cache) at 1280 x 800.</summary>
    public Task<ViewerPage> OpenViewerAsync(string query = "") => OpenViewerAsync(query, BaseAddress);

    /// <summary>A fresh browser context at 1280 x 800 on another server (see <see cref="StartSeparateServerAsync"/>).</summary>
    public async Task<ViewerPage> OpenViewerAsync(string query, Uri baseAddress)
    {
        var browser = _browser ?? throw new InvalidOperationException("the site is not started");
        var context = await browser.NewContextAsync(new BrowserNewContextOptions
        {
            BaseURL = baseAddress.ToString(),
            ViewportSize = new ViewportSize { Width = 1280, Height = 800 },
        });
        var page = await ViewerPage.OpenAsync(context, query);
        return page;
    }

    public Task<JsonElement> GetJsonAsync(string path) => GetJsonAsync(path, BaseAddress);

    public async Task<JsonElement> GetJsonAsync(string path, Uri baseAddress)
    {
        using var http = new HttpClient { BaseAddress = baseAddress, Timeout = TimeSpan.FromSeconds(30) };
        using var response = await http.GetAsync(path);
        var body = await response.Content.ReadAsStringAsync();
        if (!response.IsSuccessStatusCode)
            throw new InvalidOperationException($"GET {path} answered {(int)response.StatusCode}: {body}");
        return JsonDocument.Parse(body).RootElement.Clone();
    }

    public async Task DisposeAsync()
    {
        if (_browser is not null) await _browser.DisposeAsync();
        _playwright?.Dispose();
        if (_server is not null) await _server.DisposeAsync();
        try
        {
            Directory.Delete(_root, recursive: true);
        }
        catch (IOException)
        {
            // Left in the temp folder; not worth failing the run for.
        }
    }

    /// <summary>The field once every pyramid of it (chips and whole fields) is ready.</summary>
    public Task<FieldInfo> WaitForFieldAsync(string fieldId) => WaitForPyramidsAsync(TimeSpan.FromMinutes(2), fieldId);

    private async Task<FieldInfo> WaitForPyramidsAsync(TimeSpan limit, string fieldId = DemoFieldId, Uri? baseAddress = null)
    {
        var deadline = DateTime.UtcNow + limit;
        while (true)
        {
            var field = FieldInfo.Parse(await GetJsonAsync($"api/fields/{fieldId}", baseAddress ?? BaseAddress));
            // The whole field's pyramid is built after its chips'.
            var states = field.Bands.SelectMany(b => b.Hdus.Select(h => (Band: b.Name, Hdu: h.Name, State: h.PyramidState))
                .Concat(b.Canvas is { } canvas ? [(Band: b.Name, Hdu: "canvas", State: canvas.PyramidState)] : [])).ToList();
            if (states.Where(s => s.State == "failed").Select(s => $"{s.Band}/{s.Hdu}").FirstOrDefault() is { } failed)
                throw new InvalidOperationException($"the pyramid of {failed} failed:\n{Server.RecentOutput}");
            if (states.All(s => s.State == "ready")) return field;
            if (DateTime.UtcNow > deadline)
                throw new TimeoutException($"pyramids not ready after {limit.TotalSeconds} s:\n{Server.RecentOutput}");
            await Task.Delay(250);
        }
    }
}
