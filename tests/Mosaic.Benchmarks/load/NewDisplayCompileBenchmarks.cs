using BenchmarkDotNet.Attributes;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Rendering;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Benchmarks.Load;

/// <summary>
/// What a cold tile with new display settings pays before rendering: compiling the display into its tone map
/// (<see cref="ToneMap.Create(ValueRange, IStretchCurve, IPalette, int)"/>), against evaluating the curve and
/// palette at every one of the table's 65,536 entries (the way the table used to be filled, baseline).
/// </summary>
[MemoryDiagnoser]
public class NewDisplayCompileBenchmarks
{
    private const int Entries = ToneMap.DefaultEntries;
    private IStretchCurve? _curve;
    private IPalette? _palette;
    private ValueRange _limits;
    private readonly byte[] _table = new byte[Entries];

    [Params("asinh", "linear", "histeq")]
    public string Stretch { get; set; } = "asinh";

    [GlobalSetup]
    public void Setup()
    {
        var histogram = new ValueHistogram();
        histogram.Add(SkyTile.Create());
        var statistics = BandStatistics.From(histogram);
        IStretch stretch = Stretch switch
        {
            "linear" => new LinearStretch(),
            "histeq" => new HistEqStretch(),
            _ => DisplaySettings.Default.Stretch,
        };
        _limits = DisplaySettings.Default.Limits.Resolve(statistics, histogram);
        _curve = stretch.Resolve(new StretchContext(_limits, statistics, histogram));
        _palette = new GrayPalette();
    }

    [Benchmark(Baseline = true)]
    public byte EveryEntry()
    {
        for (var i = 0; i < Entries; i++) _table[i] = _palette!.Color(_curve!.Map(i / (double)(Entries - 1))).R;
        return _table[Entries / 2];
    }

    [Benchmark]
    public int ToneMapCreate() => ToneMap.Create(_limits, _curve!, _palette!).TableEntries;
}
