using BenchmarkDotNet.Attributes;
using Mosaic.Fits;
using Mosaic.Fits.Writing;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Pyramids;
using Mosaic.Imaging.Rendering;
using Mosaic.Imaging.Statistics;
using Mosaic.TileCache;

namespace Mosaic.Benchmarks;

/// <summary>
/// The server's tile path without HTTP, on a 4096 x 4096 sky frame with a built pyramid: a cold tile (read from the
/// FITS file or a reduced level, tone-mapped with the default field-wide display, PNG-encoded) against a warm one
/// (found in the memory tile store). Cold tiles cycle over 64 positions so no one tile's bytes stay in L1/L2.
/// </summary>
[MemoryDiagnoser]
public class TilePathBenchmarks
{
    private const int Side = 4096;
    private string _folder = "";
    private FitsFile? _fits;
    private Pyramid? _pyramid;
    private ToneMap? _toneMap;
    private MemoryTileStore? _store;
    private TileCacheService? _cache;
    private int _next;

    [GlobalSetup]
    public void Setup()
    {
        _folder = Directory.CreateTempSubdirectory("mosaic-bench-tiles-").FullName;
        var path = Path.Combine(_folder, "sky.fits");
        // Sky noise of mean 60, sigma 12 (Box-Muller) with saturated 8 x 8 spots, as in the project's baseline tile.
        var random = new Random(256);
        var pixels = new float[Side * Side];
        for (var i = 0; i < pixels.Length; i++)
        {
            var u1 = 1.0 - random.NextDouble();
            var u2 = random.NextDouble();
            pixels[i] = (float)(60 + 12 * Math.Sqrt(-2 * Math.Log(u1)) * Math.Cos(2 * Math.PI * u2));
        }
        for (var spot = 0; spot < 30 * 256; spot++)
        {
            int x0 = random.Next(Side - 8), y0 = random.Next(Side - 8);
            for (var y = y0; y < y0 + 8; y++) pixels.AsSpan(y * Side + x0, 8).Fill(65000f);
        }
        using (var stream = new FileStream(path, FileMode.CreateNew))
        using (var writer = new FitsWriter(stream))
            writer.WriteFloatImage([], Side, Side, pixels);
        _fits = FitsFile.Open(path);
        var plane = _fits.Hdus[0].Image!;
        var pyramidFolder = Path.Combine(_folder, "pyramid");
        PyramidBuilder.Build(plane, pyramidFolder, null, CancellationToken.None);
        _pyramid = Pyramid.Open(pyramidFolder, plane);
        _toneMap = DisplaySettings.Default.Compile(BandStatistics.From(_pyramid.Histogram), _pyramid.Histogram);
        _store = new MemoryTileStore(new MemoryTileStoreOptions());
        _cache = new TileCacheService(_store);
        _cache.GetOrCreateAsync("warm", () => TileRenderer.RenderPng(_pyramid, 4, 3, 5, _toneMap)).AsTask().Wait();
    }

    [GlobalCleanup]
    public void Cleanup()
    {
        _pyramid?.Dispose();
        _fits?.Dispose();
        _store?.Dispose();
        Directory.Delete(_folder, recursive: true);
    }

    private (int X, int Y) NextPosition()
    {
        var n = _next++ & 63;
        return (n & 7, n >> 3);
    }

    [Benchmark(Description = "cold tile, native level (FITS rows)")]
    public int ColdNative()
    {
        var (x, y) = NextPosition();
        return TileRenderer.RenderPng(_pyramid!, _pyramid!.Geometry.MaxZoom, x, y, _toneMap!).Length;
    }

    [Benchmark(Description = "cold tile, reduced level (cache file)")]
    public int ColdReduced()
    {
        var (x, y) = NextPosition();
        return TileRenderer.RenderPng(_pyramid!, _pyramid!.Geometry.MaxZoom - 1, x, y, _toneMap!).Length;
    }

    [Benchmark(Baseline = true, Description = "warm tile (memory store hit)")]
    public int Warm() => _cache!.GetOrCreateAsync("warm", () => throw new InvalidOperationException("must be a hit")).AsTask().Result.Bytes.Length;
}
