using BenchmarkDotNet.Attributes;
using Mosaic.Imaging.Rendering;

namespace Mosaic.Benchmarks;

/// <summary>
/// A whole cold tile from float values already read: tone map plus PNG encoding (TileRenderer.RenderPng), plain
/// gray, and gray + alpha for a tile with a masked chip edge.
/// </summary>
[MemoryDiagnoser]
public class ColdTileBenchmarks
{
    private float[] _tile = [];
    private ToneMap? _toneMap;

    [Params(false, true)]
    public bool Masked { get; set; }

    [GlobalSetup]
    public void Setup()
    {
        _tile = SkyTile.Create(withMaskedBlock: Masked);
        (_toneMap, _, _, _) = SkyTile.DefaultDisplay(_tile);
        Console.WriteLine($"// cold tile (masked {Masked}): {TileRenderer.RenderPng(_tile, _toneMap).Length} bytes");
    }

    [Benchmark(Description = "tone map + PNG from a float tile")]
    public int Render() => TileRenderer.RenderPng(_tile, _toneMap!).Length;
}
