using BenchmarkDotNet.Attributes;
using Mosaic.Fits;
using Mosaic.Fits.Writing;
using Mosaic.Imaging.Pyramids;

namespace Mosaic.Benchmarks;

/// <summary>
/// Memory of a pyramid build as the frame widens: 1024-row BITPIX -32 frames 4096, 16384 and 32768 pixels wide.
/// Every buffer of the pass is allocated once, up front, so the allocated bytes per build are its managed peak;
/// with level strips that shrink as a level widens they should stay flat while the width grows eightfold.
/// </summary>
[MemoryDiagnoser]
public class PyramidWidthBenchmarks
{
    private const int Height = 1024;

    private string _folder = "";
    private FitsFile? _fits;
    private ImagePlane? _plane;

    [Params(4096, 16384, 32768)]
    public int Width { get; set; }

    [GlobalSetup]
    public void Setup()
    {
        _folder = Directory.CreateTempSubdirectory("mosaic-bench-width-").FullName;
        var path = Path.Combine(_folder, "frame.fits");
        var random = new Random(Width);
        var pixels = new float[(long)Width * Height];
        for (var i = 0; i < pixels.Length; i++) pixels[i] = random.Next(100) == 0 ? float.NaN : 500f + 40f * random.NextSingle();
        using (var stream = new FileStream(path, FileMode.CreateNew))
        using (var writer = new FitsWriter(stream))
            writer.WriteFloatImage([], Width, Height, pixels);
        _fits = FitsFile.Open(path);
        _plane = _fits.Hdus[0].Image;
    }

    [GlobalCleanup]
    public void Cleanup()
    {
        _fits?.Dispose();
        Directory.Delete(_folder, recursive: true);
    }

    [Benchmark(Description = "build pyramid + histogram, 1024 rows")]
    public void BuildPyramid() => PyramidBuilder.Build(_plane!, Path.Combine(_folder, "pyramid"), null, CancellationToken.None);
}
