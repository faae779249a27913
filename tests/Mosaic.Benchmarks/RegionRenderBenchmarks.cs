using BenchmarkDotNet.Attributes;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Rendering;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Benchmarks;

/// <summary>render.png of a 2048 x 2048 box (the sky tile repeated) at native resolution, gray and indexed.</summary>
[MemoryDiagnoser]
public class RegionRenderBenchmarks
{
    private const int Side = 2048;
    private float[] _values = [];
    private ToneMap? _gray;
    private ToneMap? _indexed;

    [GlobalSetup]
    public void Setup()
    {
        var tile = SkyTile.Create();
        _values = new float[Side * Side];
        // Every 256-pixel run of a row is some row of the sky tile, chosen to differ between neighbours.
        for (var y = 0; y < Side; y++)
            for (var x = 0; x < Side; x += SkyTile.Side)
                tile.AsSpan((y * 7 + x / SkyTile.Side * 53) % SkyTile.Side * SkyTile.Side, SkyTile.Side).CopyTo(_values.AsSpan(y * Side + x, SkyTile.Side));
        var histogram = new ValueHistogram();
        histogram.Add(tile);
        var statistics = BandStatistics.From(histogram);
        _gray = DisplaySettings.Default.Compile(statistics, histogram);
        _indexed = (DisplaySettings.Default with { Palette = PaletteCatalog.Create("ember") }).Compile(statistics, histogram);
    }

    [Benchmark(Baseline = true, Description = "4 Mpx gray")]
    public int Gray() => RegionRenderer.RenderPng(_values, Side, Side, _gray!, MaskedColor.Transparent).Length;

    [Benchmark(Description = "4 Mpx indexed (ember)")]
    public int Indexed() => RegionRenderer.RenderPng(_values, Side, Side, _indexed!, MaskedColor.Transparent).Length;
}
