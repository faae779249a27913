using System.Security.Cryptography;
using System.Text;
using BenchmarkDotNet.Attributes;
using Microsoft.AspNetCore.Http;
using Microsoft.Extensions.Primitives;
using Mosaic.Server.Endpoints;
using Mosaic.TileCache;

namespace Mosaic.Benchmarks.Load;

/// <summary>
/// The per-request pieces of a warm tile outside the framework: parsing the display query (none given, as the
/// client's default display; and a full set), its canonical key, the tile key, the ETag as the server makes it
/// (SHA-256 of the key) against a non-cryptographic 128-bit hash, and the memory store hit they lead to (baseline).
/// </summary>
[MemoryDiagnoser]
public class WarmRequestBenchmarks
{
    private const string PyramidKey = "5c029e52dc84c0e6-canvas";
    private readonly DisplayParameters _none = new();
    private readonly CompositeParameters _noComposite = new();
    private readonly QueryCollection _noQuery = new();
    private readonly DisplayParameters _full = new()
    {
        Limits = "value", Lo = "848.8256724679087", Hi = "1696.3113058471945", Stretch = "asinh", Soft = "101.7", Pivot = "lo",
        Palette = "cubehelix", CubehelixStart = "0.5", CubehelixRotations = "-1.5", Masked = "transparent",
    };
    private MemoryTileStore? _store;
    private string _key = "";

    [GlobalSetup]
    public void Setup()
    {
        _key = $"{PyramidKey}/{DisplayQuery.Parse(_none).CanonicalKey}/4/3/2";
        _store = new MemoryTileStore(new MemoryTileStoreOptions());
        _store.Set(_key, new byte[43_000]);
    }

    [Benchmark(Baseline = true)]
    public int StoreHit() => _store!.TryGet(_key, out var bytes) ? bytes.Length : 0;

    [Benchmark]
    public object? ParseNoDisplay() => CompositeQuery.Parse(_noComposite, _none, _noQuery) ?? (object)DisplayQuery.Parse(_none);

    [Benchmark]
    public object ParseFullDisplay() => DisplayQuery.Parse(_full);

    [Benchmark]
    public int CanonicalKey() => DisplayQuery.Parse(_none).CanonicalKey.Length;

    [Benchmark]
    public int TileKey() => $"{PyramidKey}/{DisplayQuery.Parse(_none).CanonicalKey}/{4}/{3}/{2}".Length;

    [Benchmark]
    public string ETagSha256()
    {
        // As TileService.ETagOf: UTF-8 bytes, SHA-256, the first 12 bytes in hex.
        Span<byte> hash = stackalloc byte[32];
        SHA256.HashData(Encoding.UTF8.GetBytes(_key), hash);
        return "\"" + Convert.ToHexStringLower(hash[..12]) + "\"";
    }

    [Benchmark]
    public string ETagXxHash128()
    {
        Span<byte> utf8 = stackalloc byte[512];
        var length = Encoding.UTF8.GetBytes(_key, utf8);
        Span<byte> hash = stackalloc byte[16];
        System.IO.Hashing.XxHash128.Hash(utf8[..length], hash);
        return string.Create(34, hash.ToArray(), static (chars, bytes) =>
        {
            chars[0] = '"';
            Convert.TryToHexStringLower(bytes, chars[1..33], out _);
            chars[33] = '"';
        });
    }

    [Benchmark]
    public int QueryLookups()
    {
        // What binding 28 [FromQuery] properties costs on a query of three parameters (band, hdu, v).
        var query = new QueryCollection(new Dictionary<string, StringValues>
        {
            ["band"] = "red", ["hdu"] = "canvas", ["v"] = "5c029e52dc84c0e6",
        });
        var found = 0;
        foreach (var name in Names) if (query.TryGetValue(name, out _)) found++;
        return found;
    }

    private static readonly string[] Names =
    [
        "band", "hdu", "v", "limits", "lo", "hi", "plo", "phi", "klo", "khi", "stretch", "gamma", "a", "soft", "pivot",
        "palette", "ch-start", "ch-rot", "ch-hue", "ch-gamma", "masked", "rgb", "red", "green", "blue", "q", "range", "min", "scale",
    ];
}
