using BenchmarkDotNet.Attributes;
using Mosaic.Canvas;
using Mosaic.Fits;
using Mosaic.Fits.Writing;
using Mosaic.Imaging.Pyramids;

namespace Mosaic.Benchmarks;

/// <summary>
/// One native 256 x 256 tile of a field canvas (four 1024 x 1024 TAN-SIP chips, each turned a little, 30-pixel
/// gaps), as floats: from a pyramid that reads the canvas plane (resampling the chips for every tile) against one
/// built with StoreNative (one positional read from the native level file). Tiles cycle over the canvas's grid.
/// </summary>
[MemoryDiagnoser]
public class CanvasNativeTileBenchmarks
{
    private const int Side = 1024;
    private const double Scale = 7e-5;

    private string _folder = "";
    private FitsFile? _fits;
    private Pyramid? _fromPlane;
    private Pyramid? _stored;
    private readonly float[] _tile = new float[PyramidGeometry.TileSize * PyramidGeometry.TileSize];
    private int _next;

    [GlobalSetup]
    public void Setup()
    {
        _folder = Directory.CreateTempSubdirectory("mosaic-bench-canvas-tile-").FullName;
        var path = Path.Combine(_folder, "field.fits");
        var random = new Random(1024);
        var pixels = new float[Side * Side];
        for (var i = 0; i < pixels.Length; i++) pixels[i] = 500f + 40f * (random.NextSingle() - 0.5f);
        const double half = (Side + 30) / 2.0;
        (double East, double North, double Turn)[] layout = [(-half, -half, 0.3), (half, -half, -0.2), (-half, half, 0.15), (half, half, -0.35)];
        using (var writer = new FitsWriter(File.Create(path)))
        {
            writer.WriteEmptyPrimary([]);
            foreach (var (east, north, turn) in layout)
                writer.WriteFloatImage(BenchmarkChipHeader.Cards(Side, Scale, east, north, turn), Side, Side, pixels);
        }
        _fits = FitsFile.Open(path);
        var chips = _fits.Hdus.Skip(1).Select(h => new CanvasChip($"CHIP{h.Index}", h.Index, h.Image!, Wcs.Wcs.From(h.Header))).ToList();
        var plane = new CanvasBand(CanvasPlan.Create(chips.Select(c => c.Footprint).ToList()), chips).Plane;
        var fromPlane = Path.Combine(_folder, "from-plane");
        var stored = Path.Combine(_folder, "stored");
        PyramidBuilder.Build(plane, fromPlane, null, CancellationToken.None);
        PyramidBuilder.Build(plane, stored, new PyramidBuildOptions { StoreNative = true }, null, CancellationToken.None);
        _fromPlane = Pyramid.Open(fromPlane, plane);
        _stored = Pyramid.Open(stored, plane);
    }


    [GlobalCleanup]
    public void Cleanup()
    {
        _fromPlane?.Dispose();
        _stored?.Dispose();
        _fits?.Dispose();
        Directory.Delete(_folder, recursive: true);
    }

    private float Read(Pyramid pyramid)
    {
        var g = pyramid.Geometry;
        int tilesX = g.TilesX(g.MaxZoom), count = tilesX * g.TilesY(g.MaxZoom);
        var n = _next++ % count;
        pyramid.ReadTile(g.MaxZoom, n % tilesX, n / tilesX, _tile);
        return _tile[_tile.Length / 2];
    }

    [Benchmark(Baseline = true, Description = "native canvas tile, resampled from the chips")]
    public float FromCanvasPlane() => Read(_fromPlane!);

    [Benchmark(Description = "native canvas tile, stored level")]
    public float FromStoredLevel() => Read(_stored!);
}
