using Mosaic.Imaging.Tests.Statistics;

namespace Mosaic.Imaging.Tests.Pyramids;

/// <summary>Levels and their expected tile files, made once by numpy (Debian python3-numpy) for <see cref="LevelTileWriterTests"/>.</summary>
public sealed class LevelTileReference : IDisposable
{
    private const string Script = """
        T = 256
        rng = np.random.default_rng(27182)
        for name, (w, h) in {"odd": (600, 700), "wide": (1000, 300), "exact": (512, 256), "thin": (3, 5)}.items():
            level = rng.normal(100.0, 10.0, (h, w)).astype(np.float32)   # row 0 is the top
            level[rng.random((h, w)) < 0.03] = np.nan
            np.asarray(level, "<f4").tofile(name + ".rows.f32")
            ty, tx = -(-h // T), -(-w // T)
            padded = np.full((ty * T, tx * T), np.nan, dtype=np.float32)
            padded[:h, :w] = level
            tiles = padded.reshape(ty, T, tx, T).transpose(0, 2, 1, 3)
            np.asarray(tiles, "<f4").tofile(name + ".tiles.f32")
        """;

    public static readonly Dictionary<string, (int Width, int Height)> Sizes = new()
    {
        ["odd"] = (600, 700), ["wide"] = (1000, 300), ["exact"] = (512, 256), ["thin"] = (3, 5),
    };

    private readonly string _folder = Directory.CreateTempSubdirectory("mosaic-level-reference-").FullName;

    public LevelTileReference() => ReferencePython.Run(Script, _folder);

    /// <summary>The level, top row first.</summary>
    public float[] Rows(string name) => ReferencePython.ReadFloat32(Path.Combine(_folder, name + ".rows.f32"));

    /// <summary>The level file numpy lays out: NaN-padded 256x256 tiles, row-major.</summary>
    public float[] Tiles(string name) => ReferencePython.ReadFloat32(Path.Combine(_folder, name + ".tiles.f32"));

    public void Dispose() => Directory.Delete(_folder, recursive: true);
}
