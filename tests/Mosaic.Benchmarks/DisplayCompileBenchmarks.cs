using BenchmarkDotNet.Attributes;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Benchmarks;

/// <summary>Compiling one display setting into its tone map (once per setting and band; the server caches it), per stretch.</summary>
[MemoryDiagnoser]
public class DisplayCompileBenchmarks
{
    private BandStatistics? _statistics;
    private ValueHistogram? _histogram;

    [Params("asinh", "log", "sqrt", "histeq")]
    public string Stretch { get; set; } = "asinh";

    private DisplaySettings _settings = DisplaySettings.Default;

    [GlobalSetup]
    public void Setup()
    {
        var tile = SkyTile.Create();
        _histogram = new ValueHistogram();
        _histogram.Add(tile);
        _statistics = BandStatistics.From(_histogram);
        _settings = DisplaySettings.Default with
        {
            Limits = new PercentileLimits(0.5, 99.9),
            Stretch = Stretch switch
            {
                "log" => new LogStretch(LogStretch.DefaultA),
                "sqrt" => new SqrtStretch(),
                "histeq" => new HistEqStretch(),
                _ => DisplaySettings.Default.Stretch,
            },
        };
    }

    [Benchmark(Description = "compile tone map")]
    public int Compile() => _settings.Compile(_statistics!, _histogram!).TableEntries;
}
