using System.Net;
using System.Net.Http.Json;
using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Server.Tests;

public sealed class CompressedFileTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>
{
    [Fact]
    public async Task A_tile_compressed_file_is_served_with_its_pixel_values()
    {
        var dataDir = Path.Combine(data.Root, $"compressed-{Guid.NewGuid():N}");
        Directory.CreateDirectory(dataDir);
        // astropy.io.fits (Debian python3-astropy) writes the tiled image compression convention (FITS 4.0 section 10);
        // pixel (x, y) (1-based) holds (y - 1) * 64 + (x - 1).
        DebianPython.RunCode("""
import sys, numpy as np
from astropy.io import fits
fits.HDUList([fits.PrimaryHDU(), fits.CompImageHDU(np.arange(64 * 64, dtype=np.int16).reshape(64, 64), compression_type="RICE_1")]).writeto(sys.argv[1])
""", [Path.Combine(dataDir, "packed.fits.fz")]);
        File.Copy(Path.Combine(data.DataDirectory, "single.fits"), Path.Combine(dataDir, "plain.fits"));

        using var factory = new MosaicFactory(dataDir, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        var fields = (await client.GetFromJsonAsync<JsonElement>("/api/fields")).EnumerateArray()
            .ToDictionary(f => f.GetProperty("id").GetString()!);
        Assert.Equal(JsonValueKind.Null, fields["packed"].GetProperty("error").ValueKind);
        Assert.Equal(JsonValueKind.Null, fields["plain"].GetProperty("error").ValueKind);

        await MosaicFactory.WaitForPyramidsAsync(client, "packed");
        var probe = await client.GetFromJsonAsync<JsonElement>("/api/fields/packed/probe?x=5&y=3");
        Assert.Equal(2 * 64 + 4, probe.GetProperty("value").GetDouble());
        Assert.Equal(HttpStatusCode.OK, (await client.GetAsync("/tiles/packed/0/0/0.png")).StatusCode);
    }

    [Fact]
    public async Task A_file_compressed_with_a_codec_the_reader_lacks_says_which()
    {
        var dataDir = Path.Combine(data.Root, $"compressed-{Guid.NewGuid():N}");
        Directory.CreateDirectory(dataDir);
        // HCOMPRESS_1 (FITS 4.0 section 10.4.4), written by astropy.io.fits.
        DebianPython.RunCode("""
import sys, numpy as np
from astropy.io import fits
fits.HDUList([fits.PrimaryHDU(), fits.CompImageHDU(np.arange(64 * 64, dtype=np.int16).reshape(64, 64), compression_type="HCOMPRESS_1")]).writeto(sys.argv[1])
""", [Path.Combine(dataDir, "squeezed.fits.fz")]);

        using var factory = new MosaicFactory(dataDir, data.NewCacheDirectory());
        using var client = factory.CreateClient();
        var field = (await client.GetFromJsonAsync<JsonElement>("/api/fields")).EnumerateArray()
            .Single(f => f.GetProperty("id").GetString() == "squeezed");
        Assert.Contains("HCOMPRESS_1", field.GetProperty("error").GetString());
    }
}
