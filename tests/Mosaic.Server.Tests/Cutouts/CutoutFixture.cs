using System.Text.Json;
using Mosaic.Server.Tests.Views;
using Mosaic.Testing;

namespace Mosaic.Server.Tests.Cutouts;

/// <summary>
/// Two fields written by astropy.io.fits (Debian python3-astropy): "chips", a frame of a TAN-SIP int16 chip with
/// BZERO 32768 and BLANK and a float32 TAN chip beside it on the sky (so the band has a canvas); and "packed", the
/// same frame tile-compressed by fpack (libcfitsio-bin), with CFITSIO's own decompression (funpack) beside it as
/// the reference for its values. The server runs on them with a cutout limit of 20000 pixels.
/// </summary>
public sealed class CutoutFixture : IDisposable
{
    public const long PixelLimit = 20_000;

    public CutoutFixture()
    {
        Root = Path.Combine(Path.GetTempPath(), $"mosaic-cutout-tests-{Guid.NewGuid():N}");
        DataDirectory = Path.Combine(Root, "data");
        Work = Path.Combine(Root, "work");
        Directory.CreateDirectory(DataDirectory);
        Directory.CreateDirectory(Work);
        DebianPython.RunFile(SkyDataFixture.Script("cutout_fields.py"), [DataDirectory, Work]);
        UnpackedPath = Path.Combine(Work, "unpacked.fits");
        // CFITSIO's decompression of the .fz source: the reference for what its pixels are.
        var funpack = ExternalProgram.Run("/usr/bin/funpack", ["-O", UnpackedPath, PackedPath]);
        if (funpack.ExitCode != 0) throw new InvalidOperationException($"funpack (libcfitsio-bin) failed: {funpack.Stderr}");
        Factory = new StateFactory(DataDirectory, Path.Combine(Root, "cache"), Path.Combine(Root, "state"), PixelLimit);
        Client = Factory.CreateClient();
    }

    public string Root { get; }

    public string DataDirectory { get; }

    public string Work { get; }

    public string ChipsPath => Path.Combine(DataDirectory, "chips.fits");

    public string PackedPath => Path.Combine(DataDirectory, "packed.fits.fz");

    public string UnpackedPath { get; }

    public StateFactory Factory { get; }

    public HttpClient Client { get; }

    /// <summary>Downloads a cutout to a file of the work folder; fails with the server's answer unless it is 200.</summary>
    public async Task<(string Path, HttpResponseMessage Response)> Download(string query)
    {
        var response = await Client.GetAsync($"/api/fields/{query}");
        if (!response.IsSuccessStatusCode)
            throw new InvalidOperationException($"{query}: {(int)response.StatusCode} {await response.Content.ReadAsStringAsync()}");
        var path = Path.Combine(Work, $"cut-{Guid.NewGuid():N}.fits");
        await File.WriteAllBytesAsync(path, await response.Content.ReadAsByteArrayAsync());
        return (path, response);
    }

    /// <summary>What cutout_check.py (astropy) reports about a cutout against its source HDU.</summary>
    public static JsonElement Check(string source, int hdu, string cutout, int x0, int y0, params string[] more)
    {
        var json = DebianPython.RunFile(SkyDataFixture.Script("cutout_check.py"),
            [source, hdu.ToString(System.Globalization.CultureInfo.InvariantCulture), cutout,
             x0.ToString(System.Globalization.CultureInfo.InvariantCulture), y0.ToString(System.Globalization.CultureInfo.InvariantCulture), .. more]);
        return JsonDocument.Parse(json).RootElement.Clone();
    }

    public void Dispose()
    {
        Client.Dispose();
        Factory.Dispose();
        try { Directory.Delete(Root, recursive: true); } catch (IOException) { }
    }
}
