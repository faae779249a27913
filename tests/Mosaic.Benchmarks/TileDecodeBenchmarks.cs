using System.Buffers.Binary;
using System.Diagnostics;
using BenchmarkDotNet.Attributes;
using Mosaic.Fits;
using Mosaic.Fits.Writing;

namespace Mosaic.Benchmarks;

/// <summary>
/// Reading every row of a 2048 x 2048 BITPIX 16 frame: uncompressed, against the same frame packed by fpack
/// (Debian libcfitsio-bin) as RICE_1 in row tiles and in 64 x 64 tiles. Each operation opens the file afresh, so the
/// compressed cases decode every tile once (nothing is left in the plane's tile cache between operations).
/// </summary>
[MemoryDiagnoser]
public class TileDecodeBenchmarks
{
    private const int Side = 2048;

    private string _folder = "";
    private string _raw = "";
    private string _riceRows = "";
    private string _riceSquares = "";
    private float[] _rows = [];

    [GlobalSetup]
    public void Setup()
    {
        _folder = Directory.CreateTempSubdirectory("mosaic-bench-tiles-").FullName;
        _raw = Path.Combine(_folder, "frame.fits");
        // Synthetic sky: a smooth gradient plus noise (sum of uniforms), as a camera's 16-bit counts.
        var random = new Random(2048);
        var bytes = new byte[Side * Side * 2];
        for (var i = 0; i < Side * Side; i++)
        {
            var noise = random.NextSingle() + random.NextSingle() + random.NextSingle() - 1.5f;
            BinaryPrimitives.WriteInt16BigEndian(bytes.AsSpan(2 * i), (short)(1000 + 0.1f * (i % Side) + 30f * noise));
        }
        using (var stream = new FileStream(_raw, FileMode.CreateNew))
        using (var writer = new FitsWriter(stream))
            writer.WriteRawImage([], 16, [Side, Side], bytes);
        _riceRows = Pack("rows.fz");
        _riceSquares = Pack("squares.fz", "-t", "64,64");
        _rows = new float[64 * Side];
    }

    private string Pack(string name, params string[] options)
    {
        var output = Path.Combine(_folder, name);
        var start = new ProcessStartInfo("/usr/bin/fpack") { RedirectStandardError = true };
        foreach (var o in options) start.ArgumentList.Add(o);
        start.ArgumentList.Add("-O");
        start.ArgumentList.Add(output);
        start.ArgumentList.Add(_raw);
        using var process = Process.Start(start)!;
        process.WaitForExit();
        if (process.ExitCode != 0) throw new InvalidOperationException("fpack failed: " + process.StandardError.ReadToEnd());
        return output;
    }

    [GlobalCleanup]
    public void Cleanup() => Directory.Delete(_folder, recursive: true);

    [Benchmark(Baseline = true, Description = "raw BITPIX 16 (RawImagePlane)")]
    public float Raw() => ReadAll(_raw);

    [Benchmark(Description = "RICE_1, row tiles (TiledImagePlane)")]
    public float RiceRows() => ReadAll(_riceRows);

    [Benchmark(Description = "RICE_1, 64 x 64 tiles (TiledImagePlane)")]
    public float RiceSquares() => ReadAll(_riceSquares);

    private float ReadAll(string path)
    {
        using var file = FitsFile.Open(path);
        var plane = file.Hdus.First(h => h.Image is not null).Image!;
        for (var y = 0; y < Side; y += 64) plane.ReadRows(y, 64, _rows);
        return _rows[0];
    }
}
