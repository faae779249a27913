using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Server.Tests;

/// <summary>
/// A data folder written by astropy.io.fits (Debian python3-astropy): a single-frame field, a three-band folder
/// field (two bands named by FILTER, one by the file-name rule), and a file that is not FITS. astropy also reports
/// the values it reads at chosen pixels, which the probe must match.
/// </summary>
public sealed class ServerDataFixture : IDisposable
{
    public const string WriterScript = """
import json, sys, os
import numpy as np
from astropy.io import fits
root = sys.argv[1]
os.makedirs(os.path.join(root, "trio"), exist_ok=True)
rng = np.random.default_rng(7)

# single: 600 x 300 int16 with BZERO/BSCALE and BLANK; a bright block at the top-left in FITS terms (high y, low x)
raw = rng.integers(100, 200, size=(300, 600)).astype(np.int16)   # numpy [y, x], row 0 = FITS y = 1
raw[260:300, 0:40] = 30000
raw[10, 20] = -32768                                             # BLANK below
hdu = fits.PrimaryHDU(raw)
hdu.header["BZERO"] = 10.0
hdu.header["BSCALE"] = 0.5
hdu.header["BLANK"] = -32768
hdu.header["BUNIT"] = "adu"
hdu.writeto(os.path.join(root, "single.fits"), overwrite=True)

# trio: three bands; red and green with FILTER, the third named by file name; two image extensions each
for name, filt in (("trio_red.fits", "red"), ("trio_green.fits", "green"), ("trio_blue.fits", None)):
    primary = fits.PrimaryHDU()
    if filt: primary.header["FILTER"] = filt
    chips = []
    for k in (1, 2):
        data = rng.normal(50.0 * k, 5.0, size=(200, 300)).astype(np.float32)
        data[5, 7] = np.nan
        chips.append(fits.ImageHDU(data, name=f"CCD{k}"))
    fits.HDUList([primary] + chips).writeto(os.path.join(root, "trio", name), overwrite=True)

with open(os.path.join(root, "broken.fits"), "wb") as f:
    f.write(b"this is not a FITS file at all" * 200)

# what astropy reads back, with FITS 1-based pixel coordinates
out = {}
with fits.open(os.path.join(root, "single.fits")) as h:
    d = h[0].data          # astropy applies BSCALE/BZERO; BLANK becomes NaN for scaled integer data
    out["single"] = {f"{x},{y}": (None if np.isnan(d[y-1, x-1]) else float(d[y-1, x-1])) for (x, y) in [(1, 1), (21, 11), (600, 300), (5, 295), (333, 150)]}
with fits.open(os.path.join(root, "trio", "trio_green.fits")) as h:
    d = h["CCD2"].data
    out["green_ccd2"] = {f"{x},{y}": (None if np.isnan(d[y-1, x-1]) else float(d[y-1, x-1])) for (x, y) in [(8, 6), (1, 1), (300, 200), (150, 100)]}
print(json.dumps(out))
""";

    public ServerDataFixture()
    {
        Root = Path.Combine(Path.GetTempPath(), $"mosaic-server-tests-{Guid.NewGuid():N}");
        DataDirectory = Path.Combine(Root, "data");
        Directory.CreateDirectory(DataDirectory);
        var json = DebianPython.RunCode(WriterScript, [DataDirectory]);
        Reference = JsonDocument.Parse(json);
    }

    public string Root { get; }

    public string DataDirectory { get; }

    /// <summary>Values astropy read: Reference["single"]["x,y"].</summary>
    public JsonDocument Reference { get; }

    public string NewCacheDirectory() => Path.Combine(Root, $"cache-{Guid.NewGuid():N}");

    public void Dispose()
    {
        Reference.Dispose();
        try { Directory.Delete(Root, recursive: true); } catch (IOException) { }
    }
}
