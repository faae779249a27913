using Mosaic.Fits;
using Mosaic.Imaging.Pyramids;
using Mosaic.Imaging.Tests.Statistics;

namespace Mosaic.Imaging.Tests.Pyramids;

/// <summary>The frames written by astropy with their numpy references, and their pyramids built once.</summary>
public sealed class NativeReadFrames : IDisposable
{
    public static readonly string[] Names = ["u8", "i16", "u16", "i32", "f64", "f32s"];

    private const string Script = """
        W, H = 300, 520
        rng = np.random.default_rng(27182)
        kinds = {
            # name: stored dtype, BSCALE, BZERO, BLANK
            "u8": (np.uint8, 0.5, -20.0, 255),
            "i16": (np.int16, 0.25, 1000.5, -999),
            "u16": (np.int16, 1.0, 32768.0, None),
            "i32": (np.int32, 1.0, 0.0, -2147483648),
            "f64": (np.float64, 1.0, 0.0, None),
            "f32s": (np.float32, 2.5, -1.0, None),
        }
        for name, (dtype, bscale, bzero, blank) in kinds.items():
            if np.issubdtype(dtype, np.integer):
                info = np.iinfo(dtype)
                stored = rng.integers(info.min, info.max, size=(H, W), dtype=dtype, endpoint=True)
                if blank is not None:
                    stored[rng.random((H, W)) < 0.03] = blank
                    stored[H // 2, :] = blank
                    stored[:, W - 1] = blank   # the right edge column, read row by row
                masked = stored == blank if blank is not None else np.zeros((H, W), bool)
            else:
                stored = rng.normal(100.0, 40.0, size=(H, W)).astype(dtype)
                stored[rng.random((H, W)) < 0.03] = np.nan
                stored[H - 1, :] = np.nan   # the top row (FITS y = H), first in the top tile row
                masked = np.isnan(stored)
            hdu = fits.PrimaryHDU(data=stored, do_not_scale_image_data=True)
            if bscale != 1.0: hdu.header["BSCALE"] = bscale
            if bzero != 0.0: hdu.header["BZERO"] = bzero
            if blank is not None: hdu.header["BLANK"] = blank
            hdu.writeto(name + ".fits", overwrite=True)
            physical = stored.astype(np.float64) * bscale + bzero
            physical[masked] = np.nan
            np.asarray(physical[::-1], "<f4").tofile(name + ".native.f32")
            with open(name + ".json", "w") as f:
                json.dump({"masked": int(np.count_nonzero(masked))}, f)
        """;

    private readonly Dictionary<string, FitsFile> _files = [];
    private readonly Dictionary<string, Pyramid> _pyramids = [];

    public NativeReadFrames()
    {
        Folder = Directory.CreateTempSubdirectory("mosaic-native-read-").FullName;
        ReferencePython.Run(Script, Folder);
        foreach (var name in Names)
        {
            var file = FitsFile.Open(Path.Combine(Folder, name + ".fits"));
            _files[name] = file;
            var plane = Plane(name);
            var pyramidFolder = Path.Combine(Folder, "pyramids", name);
            PyramidBuilder.Build(plane, pyramidFolder, null, CancellationToken.None);
            _pyramids[name] = Pyramid.Open(pyramidFolder, plane);
        }
    }

    public string Folder { get; }

    public ImagePlane Plane(string name) => _files[name].Hdus[0].Image ?? throw new InvalidOperationException($"{name}.fits has no image");

    public Pyramid PyramidOf(string name) => _pyramids[name];

    public float[] NativeTopDown(string name) => ReferencePython.ReadFloat32(Path.Combine(Folder, name + ".native.f32"));

    public long MaskedCount(string name) => ReferencePython.ReadJson(Path.Combine(Folder, name + ".json")).GetProperty("masked").GetInt64();

    public void Dispose()
    {
        foreach (var pyramid in _pyramids.Values) pyramid.Dispose();
        foreach (var file in _files.Values) file.Dispose();
        Directory.Delete(Folder, recursive: true);
    }
}
