using System.Runtime.InteropServices;
using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Server.Tests.Composite;

/// <summary>
/// The server on a data folder written by astropy.io.fits (Debian python3-astropy): field "colour", three bands
/// (FILTER long, mid, short) of one synthetic scene on one grid with faint and bright sources, a source far past
/// any range (saturated) and masked pixels; field "offgrid", bands on grids that differ (CRPIX by 0.5 pixel, or one
/// row fewer). astropy also writes each colour band as read, flipped so row 0 is the top (highest FITS y), and
/// numpy's median and astropy.stats.mad_std of each band.
/// </summary>
public sealed class CompositeData : IAsyncLifetime
{
    public const int Width = 300, Height = 280;

    public static readonly string[] Bands = ["long", "mid", "short"];

    private const string WriterScript = """
import json, sys, os
import numpy as np
from astropy.io import fits
from astropy.stats import mad_std
root = sys.argv[1]
data = os.path.join(root, "data")
for folder in ("colour", "offgrid"):
    os.makedirs(os.path.join(data, folder), exist_ok=True)
rng = np.random.default_rng(23)
H, W = 280, 300

def header(filt, crpix1=150.0):
    h = fits.Header()
    h["FILTER"] = filt
    h["CTYPE1"], h["CTYPE2"] = "RA---TAN", "DEC--TAN"
    h["CRPIX1"], h["CRPIX2"] = crpix1, 140.0
    h["CRVAL1"], h["CRVAL2"] = 201.25, -12.5
    h["CD1_1"], h["CD1_2"], h["CD2_1"], h["CD2_2"] = -5.5e-5, 1.0e-6, 1.0e-6, 5.5e-5
    return h

yy, xx = np.mgrid[0:H, 0:W]
def blob(x, y, s):
    return np.exp(-((xx - x) ** 2 + (yy - y) ** 2) / (2 * s * s))

# per band: sky, noise, then sources with colours of their own (numpy [y, x], row 0 = FITS y 1)
sky = [40.0, 55.0, 70.0]
noise = [4.0, 5.0, 6.0]
sources = [(60, 200, 2.0, (800, 400, 100)), (220, 60, 3.0, (150, 600, 900)), (250, 240, 1.5, (60, 70, 80)),
           (120, 100, 2.5, (3000, 2000, 500)), (40, 40, 2.0, (20, 40, 300))]
bands = []
for c in range(3):
    d = sky[c] + noise[c] * rng.normal(size=(H, W))
    for (x, y, s, flux) in sources:
        d += flux[c] * blob(x, y, s)
    # saturated: a flat-topped source thousands of times past any range, channel ratio 1 : 0.45 : 0.15
    d[150:158, 200:208] = sky[c] + 5.0e5 * (1.0, 0.45, 0.15)[c]
    bands.append(d.astype(np.float32))
bands[1][10:20, 250:262] = np.nan          # masked in the middle band only
bands[0][270, 5] = np.nan                  # and one pixel of the first
for c, name in enumerate(("long", "mid", "short")):
    fits.PrimaryHDU(bands[c], header(name)).writeto(os.path.join(data, "colour", f"colour_{name}.fits"), overwrite=True)
    bands[c][::-1].tofile(os.path.join(root, f"{name}.f32"))

fits.PrimaryHDU(bands[0], header("base")).writeto(os.path.join(data, "offgrid", "offgrid_base.fits"), overwrite=True)
fits.PrimaryHDU(bands[1], header("shifted", crpix1=150.5)).writeto(os.path.join(data, "offgrid", "offgrid_shifted.fits"), overwrite=True)
fits.PrimaryHDU(bands[2][:-1], header("short")).writeto(os.path.join(data, "offgrid", "offgrid_short.fits"), overwrite=True)

print(json.dumps({"median": [float(np.nanmedian(b)) for b in bands], "madSigma": [float(mad_std(b, ignore_nan=True)) for b in bands]}))
""";

    public string Root { get; } = Path.Combine(Path.GetTempPath(), $"mosaic-composite-tests-{Guid.NewGuid():N}");

    public MosaicFactory Factory { get; private set; } = null!;

    public HttpClient Client { get; private set; } = null!;

    /// <summary>numpy.nanmedian and astropy.stats.mad_std of each colour band: "median"[c], "madSigma"[c].</summary>
    public JsonElement Statistics { get; private set; }

    /// <summary>Each colour band as astropy read it, row 0 the top of the image (FITS y = 280), 300 values a row.</summary>
    public float[][] Values { get; private set; } = [];

    public async Task InitializeAsync()
    {
        Directory.CreateDirectory(Root);
        Statistics = JsonDocument.Parse(DebianPython.RunCode(WriterScript, [Root])).RootElement.Clone();
        Values = Bands.Select(b => MemoryMarshal.Cast<byte, float>(File.ReadAllBytes(Path.Combine(Root, $"{b}.f32"))).ToArray()).ToArray();
        Factory = new MosaicFactory(Path.Combine(Root, "data"), Path.Combine(Root, "cache"));
        Client = Factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(Client, "colour");
        await MosaicFactory.WaitForPyramidsAsync(Client, "offgrid");
    }

    /// <summary>astropy.visualization.make_lupton_rgb of the whole image (top row first), 3 bytes a pixel; weights applied to (v - min) beforehand.</summary>
    public byte[] Lupton(double q, double range, double[] min, double[] scale)
    {
        const string script = """
import sys, json
import numpy as np
from astropy.visualization import make_lupton_rgb
p = json.loads(sys.argv[1])
bands = [np.fromfile(f"{b}.f32", dtype=np.float32).reshape(280, 300) for b in ("long", "mid", "short")]
scaled = [((b - np.float32(m)) * np.float32(s)).astype(np.float32) for b, m, s in zip(bands, p["min"], p["scale"])]
make_lupton_rgb(*scaled, minimum=0, stretch=p["range"], Q=p["q"]).astype(np.uint8).tofile("lupton.u8")
print("ok")
""";
        DebianPython.RunCode(script, [JsonSerializer.Serialize(new { q, range, min, scale })], workingDirectory: Root);
        return File.ReadAllBytes(Path.Combine(Root, "lupton.u8"));
    }

    /// <summary>
    /// Each channel by astropy.visualization: ManualInterval(lo, hi) with clipping, then LinearStretch or
    /// LogStretch(a) (log(a x + 1) / log(a + 1)), times the weight, clipped to [0, 1], round(255 t).
    /// </summary>
    public byte[] PerBand(object channels)
    {
        const string script = """
import sys, json
import numpy as np
from astropy.visualization import ManualInterval, LinearStretch, LogStretch
ch = json.loads(sys.argv[1])
out = np.zeros((280, 300, 3), dtype=np.uint8)
for c, (b, p) in enumerate(zip(("long", "mid", "short"), ch)):
    v = np.fromfile(f"{b}.f32", dtype=np.float32).reshape(280, 300).astype(np.float64)
    u = ManualInterval(p["lo"], p["hi"])(np.nan_to_num(v, nan=p["lo"]), clip=True)
    t = (LogStretch(a=p["a"]) if p["stretch"] == "log" else LinearStretch())(u, clip=True)
    out[..., c] = np.floor(255 * np.clip(t * p["scale"], 0, 1) + 0.5).astype(np.uint8)
out.tofile("each.u8")
print("ok")
""";
        DebianPython.RunCode(script, [JsonSerializer.Serialize(channels)], workingDirectory: Root);
        return File.ReadAllBytes(Path.Combine(Root, "each.u8"));
    }

    public bool Masked(int row, int column) => Values.Any(v => float.IsNaN(v[row * Width + column]));

    public Task DisposeAsync()
    {
        Client.Dispose();
        Factory.Dispose();
        try { Directory.Delete(Root, recursive: true); } catch (IOException) { }
        return Task.CompletedTask;
    }
}
