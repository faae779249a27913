using System.Text.Json;
using Mosaic.Fits;
using Mosaic.Imaging.Pyramids;
using Mosaic.Imaging.Tests.Statistics;

namespace Mosaic.Imaging.Tests.Pyramids;

/// <summary>
/// Synthetic frames with masked pixels, rows, columns and blocks, written as BITPIX -32 FITS by astropy (Debian
/// python3-astropy); numpy (Debian python3-numpy) computes the expected reduced levels independently (float64
/// nanmean over the 2x2 blocks of the level below, top-anchored). Each frame's pyramid is built once here.
/// </summary>
public sealed class ReferenceImages : IDisposable
{
    public static readonly string[] Names = ["wide_odd", "strip", "tall", "small", "even"];

    private const string Script = """
        T = 256
        W = 2.0 ** -11
        rng = np.random.default_rng(314159)
        sizes = {"wide_odd": (1000, 777), "strip": (257, 3), "tall": (3, 1500), "small": (200, 100), "even": (512, 512)}

        def frame(w, h):
            yy, xx = np.mgrid[0:h, 0:w].astype(np.float64)
            data = 500.0 + 0.05 * xx - 0.03 * yy + rng.normal(0.0, 20.0, (h, w))
            for _ in range(6):
                cx, cy, s = rng.uniform(0, w), rng.uniform(0, h), rng.uniform(1.5, 6.0)
                data += rng.uniform(200, 5000) * np.exp(-((xx - cx) ** 2 + (yy - cy) ** 2) / (2 * s * s))
            data[rng.random((h, w)) < 0.05] = np.nan
            data[h // 3: h // 3 + 9, w // 5: w // 5 + 13] = np.nan   # whole blocks masked: NaN above
            data[h // 2, :] = np.nan
            data[:, (2 * w) // 3] = np.nan
            return data.astype(np.float32)   # data[y0, x]: row 0 is FITS y = 1, the bottom

        def reduce(level):
            h, w = level.shape
            padded = np.full((2 * ((h + 1) // 2), 2 * ((w + 1) // 2)), np.nan)
            padded[:h, :w] = level
            blocks = padded.reshape(padded.shape[0] // 2, 2, padded.shape[1] // 2, 2)
            with warnings.catch_warnings():
                warnings.simplefilter("ignore", RuntimeWarning)   # all-NaN blocks give NaN, as they should
                return np.nanmean(blocks, axis=(1, 3))

        for name, (w, h) in sizes.items():
            data = frame(w, h)
            fits.PrimaryHDU(data=data).writeto(name + ".fits", overwrite=True)
            top = data[::-1]
            np.asarray(top, "<f4").tofile(name + ".native.f32")
            max_zoom = 0
            while T * 2 ** max_zoom < max(w, h):
                max_zoom += 1
            level = top.astype(np.float64)
            levels = {}
            for z in range(max_zoom - 1, -1, -1):
                level = reduce(level)
                np.asarray(level, "<f8").tofile(f"{name}.level{z}.f64")
                levels[str(z)] = [int(level.shape[1]), int(level.shape[0])]
            v = np.sort(data[np.isfinite(data)].astype(np.float64))
            def quantile(p):
                h_ = p / 100.0 * (v.size - 1)
                k = int(np.floor(h_)); k1 = min(k + 1, v.size - 1)
                return {"p": p, "value": float(np.nanpercentile(data.astype(np.float64), p)),
                        "tolerance": float(W * max(abs(v[k]), abs(v[k1])) + (v[k1] - v[k]))}
            out = {"width": w, "height": h, "maxZoom": max_zoom, "levels": levels,
                   "finite": int(v.size), "masked": int(np.count_nonzero(np.isnan(data))),
                   "min": float(v[0]), "max": float(v[-1]),
                   "quantiles": [quantile(p) for p in (0.5, 50.0, 99.5)]}
            with open(name + ".json", "w") as f:
                json.dump(out, f, allow_nan=False)
        """;

    private readonly Dictionary<string, FitsFile> _files = [];
    private readonly Dictionary<string, Pyramid> _pyramids = [];

    public ReferenceImages()
    {
        Folder = Directory.CreateTempSubdirectory("mosaic-pyramid-").FullName;
        ReferencePython.Run(Script, Folder);
        foreach (var name in Names)
        {
            var file = FitsFile.Open(FitsPath(name));
            _files[name] = file;
            var progress = new ProgressLog();
            PyramidBuilder.Build(Plane(name), PyramidFolder(name), progress, CancellationToken.None);
            Progress[name] = progress.Values;
            _pyramids[name] = Pyramid.Open(PyramidFolder(name), Plane(name));
        }
    }

    public string Folder { get; }

    public Dictionary<string, IReadOnlyList<double>> Progress { get; } = [];

    public string FitsPath(string name) => Path.Combine(Folder, name + ".fits");

    public string PyramidFolder(string name) => Path.Combine(Folder, "pyramids", name);

    public ImagePlane Plane(string name) => _files[name].Hdus[0].Image ?? throw new InvalidOperationException($"{name}.fits has no image");

    public Pyramid PyramidOf(string name) => _pyramids[name];

    public JsonElement Expected(string name) => ReferencePython.ReadJson(Path.Combine(Folder, name + ".json"));

    /// <summary>The frame as numpy sees it, top row first.</summary>
    public float[] NativeTopDown(string name) => ReferencePython.ReadFloat32(Path.Combine(Folder, name + ".native.f32"));

    public double[] ExpectedLevel(string name, int z) => ReferencePython.ReadFloat64(Path.Combine(Folder, $"{name}.level{z}.f64"));

    public void Dispose()
    {
        foreach (var pyramid in _pyramids.Values) pyramid.Dispose();
        foreach (var file in _files.Values) file.Dispose();
        Directory.Delete(Folder, recursive: true);
    }
}
