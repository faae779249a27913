using System.Net.Http.Json;
using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Server.Tests;

public sealed class CompressedFileTests(ServerDataFixture data) : IClassFixture<ServerDataFixture>
{
    [Fact]
    public async Task A_tile_compressed_file_is_listed_with_the_reason_it_cannot_be_shown_yet()
    {
        var dataDir = Path.Combine(data.Root, $"compressed-{Guid.NewGuid():N}");
        Directory.CreateDirectory(dataDir);
        // astropy.io.fits (Debian python3-astropy) writes the tiled image compression convention (FITS 4.0 section 10).
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
        Assert.Contains("tile-compressed", fields["packed"].GetProperty("error").GetString());
        Assert.Equal(JsonValueKind.Null, fields["plain"].GetProperty("error").ValueKind);
    }
}
