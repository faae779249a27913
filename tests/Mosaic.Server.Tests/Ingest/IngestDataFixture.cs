using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Server.Tests.Ingest;

/// <summary>
/// A data folder written by astropy.io.fits (Debian python3-astropy): a folder field of two bands (FILTER a and b),
/// each with two float32 chips side by side on the sky (TAN WCS) and some NaN pixels, band b's chips a different
/// size from band a's; a single-frame int16 file; and a file that is not FITS. numpy reports, per band, the pixel
/// count, the NaN count, min and max, and every image HDU's shape.
/// </summary>
public sealed class IngestDataFixture : IDisposable
{
    private const string WriterScript = """
import json, sys, os
import numpy as np
from astropy.io import fits
root = sys.argv[1]
os.makedirs(os.path.join(root, "camp"), exist_ok=True)
rng = np.random.default_rng(11)
out = {"bands": {}, "images": []}

def chip(data, name, crval1, scale):
    h = fits.ImageHDU(data, name=name)
    ny, nx = data.shape
    h.header["CTYPE1"], h.header["CTYPE2"] = "RA---TAN", "DEC--TAN"
    h.header["CRPIX1"], h.header["CRPIX2"] = (nx + 1) / 2, (ny + 1) / 2
    h.header["CRVAL1"], h.header["CRVAL2"] = crval1, -12.5
    h.header["CD1_1"], h.header["CD2_2"] = -scale, scale
    h.header["CD1_2"], h.header["CD2_1"] = 0.0, 0.0
    h.header["RADESYS"] = "ICRS"
    return h

# Two bands, two chips each; the chips abut in RA with a small gap. Band b is on a coarser grid (different sizes).
for filt, (nx, ny), scale in (("a", (300, 200), 0.25 / 3600), ("b", (240, 160), 0.3125 / 3600)):
    chips, values = [], []
    for k in (1, 2):
        data = rng.normal(100.0 * k, 4.0, size=(ny, nx)).astype(np.float32)
        data[3 * k, 5:9] = np.nan
        width_deg = nx * scale / np.cos(np.radians(12.5))
        chips.append(chip(data, f"CHIP{k}", 150.0 + (k - 1.5) * width_deg * 1.02, scale))
        values.append(data.ravel())
        out["images"].append({"field": "camp", "band": filt, "hdu": k, "width": nx, "height": ny})
    primary = fits.PrimaryHDU()
    primary.header["FILTER"] = filt
    fits.HDUList([primary] + chips).writeto(os.path.join(root, "camp", f"camp_{filt}.fits"), overwrite=True)
    v = np.concatenate(values)
    finite = v[np.isfinite(v)]
    out["bands"][filt] = {"count": int(finite.size), "masked": int(v.size - finite.size),
                          "min": float(finite.min()), "max": float(finite.max())}

raw = rng.integers(0, 1000, size=(130, 170)).astype(np.int16)
fits.PrimaryHDU(raw).writeto(os.path.join(root, "plain.fits"), overwrite=True)
out["images"].append({"field": "plain", "band": "plain", "hdu": 0, "width": 170, "height": 130})

with open(os.path.join(root, "garbled.fits"), "wb") as f:
    f.write(b"not a FITS header " * 300)
print(json.dumps(out))
""";

    public IngestDataFixture()
    {
        Root = Path.Combine(Path.GetTempPath(), $"mosaic-ingest-tests-{Guid.NewGuid():N}");
        DataDirectory = Path.Combine(Root, "data");
        Directory.CreateDirectory(DataDirectory);
        Reference = JsonDocument.Parse(DebianPython.RunCode(WriterScript, [DataDirectory]));
    }

    public string Root { get; }

    public string DataDirectory { get; }

    /// <summary>numpy's figures: Reference["bands"]["a"]["count"], Reference["images"][i]["width"].</summary>
    public JsonDocument Reference { get; }

    public string NewCacheDirectory() => Path.Combine(Root, $"cache-{Guid.NewGuid():N}");

    public void Dispose()
    {
        Reference.Dispose();
        try { Directory.Delete(Root, recursive: true); } catch (IOException) { }
    }
}
