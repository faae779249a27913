using BenchmarkDotNet.Attributes;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Rendering;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Benchmarks;

/// <summary>
/// A whole cold tile from floats with each kind of output: gray, indexed (cubehelix, 1 byte a pixel like gray),
/// and gray with an opaque masked colour (RGB, 3 bytes a pixel) for the tile with a masked chip edge.
/// </summary>
[MemoryDiagnoser]
public class ColourTileBenchmarks
{
    private float[] _tile = [];
    private ToneMap? _gray;
    private ToneMap? _indexed;
    private ToneMap? _grayMaskedColour;

    [Params(false, true)]
    public bool Masked { get; set; }

    [GlobalSetup]
    public void Setup()
    {
        _tile = SkyTile.Create(withMaskedBlock: Masked);
        var histogram = new ValueHistogram();
        histogram.Add(_tile);
        var statistics = BandStatistics.From(histogram);
        _gray = DisplaySettings.Default.Compile(statistics, histogram);
        _indexed = (DisplaySettings.Default with { Palette = new CubehelixPalette() }).Compile(statistics, histogram);
        _grayMaskedColour = (DisplaySettings.Default with { Masked = MaskedColor.Parse("ff00ff") }).Compile(statistics, histogram);
        Console.WriteLine($"// masked {Masked}: gray {TileRenderer.RenderPng(_tile, _gray).Length} B, indexed {TileRenderer.RenderPng(_tile, _indexed).Length} B, " +
                          $"gray + masked colour {TileRenderer.RenderPng(_tile, _grayMaskedColour).Length} B");
    }

    [Benchmark(Baseline = true, Description = "gray")]
    public int Gray() => TileRenderer.RenderPng(_tile, _gray!).Length;

    [Benchmark(Description = "indexed cubehelix")]
    public int Indexed() => TileRenderer.RenderPng(_tile, _indexed!).Length;

    [Benchmark(Description = "gray, masked colour")]
    public int GrayMaskedColour() => TileRenderer.RenderPng(_tile, _grayMaskedColour!).Length;
}
