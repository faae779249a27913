using BenchmarkDotNet.Attributes;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.Formats.Png;
using SixLabors.ImageSharp.PixelFormats;
using Ours = Mosaic.Imaging.Encoding.PngEncoder;
using OurCompression = Mosaic.Imaging.Encoding.PngCompression;

namespace Mosaic.Benchmarks;

/// <summary>
/// PNG encoding of the tone-mapped sky tile (8-bit gray): our encoder with each compression against ImageSharp
/// 2.1.13's PngEncoder at its fastest settings (L8, level 1, no filter), the reference.
/// </summary>
[MemoryDiagnoser]
public class PngEncodeBenchmarks
{
    private byte[] _levels = [];
    private Image<L8>? _image;
    private readonly MemoryStream _imageSharpOutput = new();

    private static readonly PngEncoder ImageSharpFastest = new()
    {
        ColorType = PngColorType.Grayscale,
        BitDepth = PngBitDepth.Bit8,
        CompressionLevel = PngCompressionLevel.Level1,
        FilterMethod = PngFilterMethod.None,
        ChunkFilter = PngChunkFilter.ExcludeAll,
    };

    [GlobalSetup]
    public void Setup()
    {
        var tile = SkyTile.Create();
        var (toneMap, _, _, _) = SkyTile.DefaultDisplay(tile);
        _levels = new byte[tile.Length];
        toneMap.Apply(tile, _levels);
        _image = Image.LoadPixelData<L8>(_levels, SkyTile.Side, SkyTile.Side);
        foreach (var compression in Enum.GetValues<OurCompression>())
            Console.WriteLine($"// ours {compression}: {Ours.EncodeGray(_levels, SkyTile.Side, SkyTile.Side, compression).Length} bytes");
        Console.WriteLine($"// ImageSharp L8 level 1 no filter: {ImageSharp()} bytes");
    }

    [GlobalCleanup]
    public void Cleanup() => _image?.Dispose();

    [Benchmark(Baseline = true, Description = "ImageSharp 2.1.13 L8 level 1, no filter")]
    public long ImageSharp()
    {
        _imageSharpOutput.Position = 0;
        _imageSharpOutput.SetLength(0);
        _image!.Save(_imageSharpOutput, ImageSharpFastest);
        return _imageSharpOutput.Length;
    }

    [Benchmark(Description = "ours, own Huffman-only deflate")]
    public int HuffmanOnly() => Ours.EncodeGray(_levels, SkyTile.Side, SkyTile.Side, OurCompression.HuffmanOnly).Length;

    [Benchmark(Description = "ours, zlib level 1 Huffman only")]
    public int ZlibHuffmanOnly() => Ours.EncodeGray(_levels, SkyTile.Side, SkyTile.Side, OurCompression.ZlibHuffmanOnly).Length;

    [Benchmark(Description = "ours, level 1 default strategy")]
    public int Fastest() => Ours.EncodeGray(_levels, SkyTile.Side, SkyTile.Side, OurCompression.Fastest).Length;

    [Benchmark(Description = "ours, stored (no compression)")]
    public int Stored() => Ours.EncodeGray(_levels, SkyTile.Side, SkyTile.Side, OurCompression.Stored).Length;
}
