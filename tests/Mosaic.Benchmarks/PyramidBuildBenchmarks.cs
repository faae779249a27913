using BenchmarkDotNet.Attributes;
using Mosaic.Fits;
using Mosaic.Fits.Writing;
using Mosaic.Imaging.Pyramids;

namespace Mosaic.Benchmarks;

/// <summary>
/// Building the pyramid of a 4096 x 4096 BITPIX -32 frame (64 MiB of pixels: every reduced level plus the
/// histogram, in one pass) against reading the same file's bytes once, the floor any build must pay.
/// The file sits in the page cache after the first iteration.
/// </summary>
[MemoryDiagnoser]
public class PyramidBuildBenchmarks
{
    private const int Side = 4096;

    private string _folder = "";
    private string _fitsPath = "";
    private FitsFile? _fits;
    private ImagePlane? _plane;
    private byte[] _readBuffer = [];

    [GlobalSetup]
    public void Setup()
    {
        _folder = Directory.CreateTempSubdirectory("mosaic-bench-pyramid-").FullName;
        _fitsPath = Path.Combine(_folder, "frame.fits");
        // Synthetic sky: a smooth gradient, Gaussian-ish noise (sum of uniforms) and 1% masked pixels.
        var random = new Random(4096);
        var pixels = new float[Side * Side];
        for (var y = 0; y < Side; y++)
        for (var x = 0; x < Side; x++)
        {
            var noise = random.NextSingle() + random.NextSingle() + random.NextSingle() - 1.5f;
            pixels[y * Side + x] = random.Next(100) == 0 ? float.NaN : 500f + 0.01f * x + 40f * noise;
        }
        using (var stream = new FileStream(_fitsPath, FileMode.CreateNew))
        using (var writer = new FitsWriter(stream))
            writer.WriteFloatImage([], Side, Side, pixels);
        _fits = FitsFile.Open(_fitsPath);
        _plane = _fits.Hdus[0].Image;
        _readBuffer = new byte[4 << 20];
    }

    [GlobalCleanup]
    public void Cleanup()
    {
        _fits?.Dispose();
        Directory.Delete(_folder, recursive: true);
    }

    [Benchmark(Baseline = true, Description = "read file once (RandomAccess)")]
    public long ReadFileOnce()
    {
        using var handle = File.OpenHandle(_fitsPath);
        long offset = 0;
        int read;
        while ((read = RandomAccess.Read(handle, _readBuffer, offset)) > 0) offset += read;
        return offset;
    }

    [Benchmark(Description = "decode all rows once (ImagePlane.ReadRows)")]
    public float DecodeRowsOnce()
    {
        var rows = new float[64 * Side];
        for (var y = 0; y < Side; y += 64) _plane!.ReadRows(y, 64, rows);
        return rows[0];
    }

    /// <summary>Each call after the first replaces the previous build, as a cache refresh does (the old folder's deletion is measured too: about 21 MiB in six files).</summary>
    [Benchmark(Description = "build pyramid + histogram")]
    public void BuildPyramid() => PyramidBuilder.Build(_plane!, PyramidFolder, null, CancellationToken.None);

    private string PyramidFolder => Path.Combine(_folder, "pyramid");
}
