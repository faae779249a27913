using BenchmarkDotNet.Attributes;
using Mosaic.Imaging.Rendering;

namespace Mosaic.Benchmarks;

/// <summary>
/// Stretch and palette of one 256 x 256 tile with the default asinh display: the compiled lookup table
/// (ToneMap.Apply) against evaluating asinh per pixel in double, the obvious straight code.
/// </summary>
[MemoryDiagnoser]
public class ToneMapBenchmarks
{
    private float[] _tile = [];
    private readonly byte[] _levels = new byte[SkyTile.Side * SkyTile.Side];
    private ToneMap? _toneMap;
    private double _lo, _hi, _soft;

    [GlobalSetup]
    public void Setup()
    {
        _tile = SkyTile.Create();
        (_toneMap, _lo, _hi, _soft) = SkyTile.DefaultDisplay(_tile);
        SkyTile.Export(_tile, _lo, _hi, _soft);
        Console.WriteLine($"// tone map: lo {_lo:R} hi {_hi:R} soft {_soft:R}, {_toneMap.TableEntries} table entries");
    }

    [Benchmark(Baseline = true, Description = "scalar Math.Asinh per pixel")]
    public int ScalarAsinh()
    {
        var fLo = 0.0;
        var scale = 255 / Math.Asinh((_hi - _lo) / _soft);
        var masked = 0;
        for (var i = 0; i < _tile.Length; i++)
        {
            var v = _tile[i];
            if (float.IsNaN(v)) { _levels[i] = 0; masked++; continue; }
            var t = (Math.Asinh((Math.Clamp(v, _lo, _hi) - _lo) / _soft) - fLo) * scale;
            _levels[i] = (byte)(t + 0.5);
        }
        return masked;
    }

    [Benchmark(Description = "ToneMap.Apply (lookup table)")]
    public int Apply() => _toneMap!.Apply(_tile, _levels);
}
