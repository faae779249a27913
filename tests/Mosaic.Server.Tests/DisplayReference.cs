using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Server.Tests;

/// <summary>
/// The server on the fixture data with every pyramid ready, shared by a test class, and what numpy and astropy
/// (Debian python3-numpy, python3-astropy) compute from the same files: box pixels and statistics, field-wide
/// percentiles with the sorted neighbours around each rank, and histogram counts with the pixels near each edge.
/// </summary>
public sealed class DisplayReference : IAsyncLifetime
{
    /// <summary>Relative width of a bin of the server's value histogram (2^-11), the precision of field-wide figures.</summary>
    public const double HistogramPrecision = 1.0 / 2048;

    public const string Script = """
import json, sys, os
import numpy as np
from astropy.io import fits
from astropy.stats import mad_std
root = sys.argv[1]
PCTS = [0.1, 0.5, 1, 5, 25, 50, 75, 95, 99, 99.5, 99.9]
P = 2.0 ** -11

def key(p):
    return repr(float(p)).rstrip('0').rstrip('.') if '.' in repr(float(p)) else repr(p)

def box_stats(d, x0, y0, x1, y1):
    b = d[y0-1:y1, x0-1:x1].astype(np.float64)     # numpy [y, x]; FITS 1-based inclusive box
    fin = b[np.isfinite(b)]
    return {
        "count": int(fin.size), "masked": int(b.size - fin.size),
        "min": float(fin.min()), "max": float(fin.max()), "mean": float(fin.mean()),
        "median": float(np.nanmedian(b)), "madSigma": float(mad_std(b, ignore_nan=True)),
        "percentiles": {key(p): float(np.nanpercentile(b, p)) for p in PCTS},
    }

def bracket(s, p):
    # numpy's linear rule interpolates between the sorted values at floor and ceil of rank p (n - 1)
    r = p / 100.0 * (s.size - 1)
    return [float(s[int(np.floor(r))]), float(s[int(np.ceil(r))]), float(np.percentile(s, p))]

def near(fin, e):
    return int(np.count_nonzero(np.abs(fin - e) <= P * abs(e) * 1.0001 + 1e-12))

out = {}
with fits.open(os.path.join(root, "single.fits")) as h:
    d = h[0].data.astype(np.float64)
    out["singleRender"] = [[None if np.isnan(v) else float(v) for v in d[y-1, 15-1:30]] for y in range(14, 4, -1)]
    out["singleBox"] = box_stats(d, 15, 5, 30, 14)
    out["singleWhole"] = box_stats(d, 1, 1, 600, 300)
    # zoom 1 of the pyramid: NaN-aware means of 2 x 2 native blocks, anchored at the top (highest FITS y)
    level = np.nanmean(d[::-1].reshape(150, 2, 300, 2), axis=(1, 3))
    out["singleLevel1"] = box_stats(level, 1, 1, 300, 150)
with fits.open(os.path.join(root, "trio", "trio_green.fits")) as h:
    out["greenBox"] = box_stats(h["CCD2"].data, 5, 3, 120, 90)

chips = []
with fits.open(os.path.join(root, "trio", "trio_red.fits")) as h:
    for name in ("CCD1", "CCD2"):
        chips.append(h[name].data.astype(np.float64).ravel())
red = np.concatenate(chips)
fin = np.sort(red[np.isfinite(red)])
mad = float(np.median(np.abs(fin - np.median(fin))))
dev = np.sort(np.abs(fin - np.median(fin)))
out["redField"] = {
    "count": int(fin.size), "masked": int(red.size - fin.size), "min": float(fin[0]), "max": float(fin[-1]),
    "mean": float(fin.mean()), "median": bracket(fin, 50), "mad": mad, "madGap": float(bracket(dev, 50)[1] - bracket(dev, 50)[0]),
    "percentiles": {key(p): bracket(fin, p) for p in PCTS},
    "p1": bracket(fin, 1), "p99": bracket(fin, 99),
}
lo, hi, bins = 30.0, 120.0, 45
counts, edges = np.histogram(fin, bins=bins, range=(lo, hi))
out["redHistogram"] = {
    "lo": lo, "hi": hi, "bins": bins, "counts": [int(c) for c in counts],
    "edgeSlack": [near(fin, float(e)) for e in edges],
    "below": int(np.count_nonzero(fin < lo)), "above": int(np.count_nonzero(fin > hi)),
}
edges = np.geomspace(lo, hi, 21)
counts, _ = np.histogram(fin, bins=edges)
out["redLogHistogram"] = {
    "lo": lo, "hi": hi, "bins": 20, "edges": [float(e) for e in edges], "counts": [int(c) for c in counts],
    "edgeSlack": [near(fin, float(e)) for e in edges],
}
print(json.dumps(out))
""";

    public ServerDataFixture Data { get; } = new();

    public MosaicFactory Factory { get; private set; } = null!;

    public HttpClient Client { get; private set; } = null!;

    public JsonElement Expected { get; private set; }

    public async Task InitializeAsync()
    {
        Expected = JsonDocument.Parse(DebianPython.RunCode(Script, [Data.DataDirectory])).RootElement.Clone();
        Factory = new MosaicFactory(Data.DataDirectory, Data.NewCacheDirectory());
        Client = Factory.CreateClient();
        await MosaicFactory.WaitForPyramidsAsync(Client, "single");
        await MosaicFactory.WaitForPyramidsAsync(Client, "trio");
    }

    public Task DisposeAsync()
    {
        Client.Dispose();
        Factory.Dispose();
        Data.Dispose();
        return Task.CompletedTask;
    }
}
