using BenchmarkDotNet.Attributes;
using Mosaic.Canvas;
using Mosaic.Fits;
using Mosaic.Fits.Writing;

namespace Mosaic.Benchmarks;

/// <summary>
/// Reading a field canvas (four 2048 x 2048 TAN-SIP chips, each turned a little, 30-pixel gaps: a canvas of about
/// 4150 x 4150) in strips of 64 rows, as the pyramid pass reads it, against reading the same chips' own rows from
/// their files (16.8 Mpx either way, from the page cache).
/// </summary>
[MemoryDiagnoser]
public class CanvasReadBenchmarks
{
    private const int Side = 2048;
    private const int Strip = 64;
    private const double Scale = 7e-5;

    private string _folder = "";
    private FitsFile? _fits;
    private List<CanvasChip> _chips = [];
    private float[] _buffer = [];

    [GlobalSetup]
    public void Setup()
    {
        _folder = Directory.CreateTempSubdirectory("mosaic-bench-canvas-").FullName;
        var path = Path.Combine(_folder, "field.fits");
        var random = new Random(2048);
        var pixels = new float[Side * Side];
        for (var i = 0; i < pixels.Length; i++) pixels[i] = 500f + 40f * (random.NextSingle() - 0.5f);
        (double East, double North, double Turn)[] layout = [(-1039, -1039, 0.3), (1039, -1039, -0.2), (-1039, 1039, 0.15), (1039, 1039, -0.35)];
        using (var writer = new FitsWriter(File.Create(path)))
        {
            writer.WriteEmptyPrimary([]);
            foreach (var (east, north, turn) in layout)
                writer.WriteFloatImage(BenchmarkChipHeader.Cards(Side, Scale, east, north, turn), Side, Side, pixels);
        }
        _fits = FitsFile.Open(path);
        _chips = _fits.Hdus.Skip(1).Select(h => new CanvasChip($"CHIP{h.Index}", h.Index, h.Image!, Wcs.Wcs.From(h.Header))).ToList();
        _buffer = new float[Strip * 4200];
    }


    [GlobalCleanup]
    public void Cleanup()
    {
        _fits?.Dispose();
        Directory.Delete(_folder, recursive: true);
    }

    [Benchmark(Baseline = true, Description = "chip rows (RawImagePlane), 4 x 2048^2")]
    public float ChipRows()
    {
        float sum = 0;
        foreach (var chip in _chips)
            for (var y = 0; y < Side; y += Strip)
            {
                chip.Plane.ReadRows(y, Strip, _buffer.AsSpan(0, Strip * Side));
                sum += _buffer[0];
            }
        return sum;
    }

    [Benchmark(Description = "canvas rows (plan + band + resampling)")]
    public float CanvasRows()
    {
        // A new band each time: grid nodes are computed inside the measurement, as for a first pyramid build.
        var plan = CanvasPlan.Create(_chips.Select(c => c.Footprint).ToList());
        var plane = new CanvasBand(plan, _chips).Plane;
        if (_buffer.Length < Strip * plane.Width) _buffer = new float[Strip * plane.Width];
        float sum = 0;
        for (var y = 0; y < plane.Height; y += Strip)
        {
            var rows = Math.Min(Strip, plane.Height - y);
            plane.ReadRows(y, rows, _buffer.AsSpan(0, rows * plane.Width));
            sum += _buffer[rows * plane.Width / 2];
        }
        return sum;
    }
}
