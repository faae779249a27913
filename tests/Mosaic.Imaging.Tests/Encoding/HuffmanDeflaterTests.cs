using Mosaic.Imaging.Encoding;
using Mosaic.Imaging.Tests.Display;

namespace Mosaic.Imaging.Tests.Encoding;

/// <summary>
/// Our own Huffman-only deflate inside PNGs, inflated by Python's zlib (Debian python3, zlib.decompress checks the
/// Adler-32) and compared with zlib's own Huffman-only output size (zlib.compressobj(1, strategy=Z_HUFFMAN_ONLY)).
/// </summary>
public sealed class HuffmanDeflaterTests
{
    public static TheoryData<string> Kinds() => ["one value", "two values", "all values", "fibonacci", "noise", "large noise", "rare values", "rgb tile"];

    [Theory]
    [MemberData(nameof(Kinds))]
    public void Python_zlib_inflates_it_to_the_rows_and_zlib_compresses_no_better(string kind)
    {
        var (pixels, width, height) = Make(kind);
        var png = PngEncoder.EncodeGray(pixels, width, height, PngCompression.HuffmanOnly);
        var idat = PngChunks.Read(png).Where(c => c.Type == "IDAT").SelectMany(c => c.Data).ToArray();
        var rows = new byte[(width + 1) * height];
        for (var y = 0; y < height; y++) pixels.AsSpan(y * width, width).CopyTo(rows.AsSpan(y * (width + 1) + 1));
        using var folder = new TemporaryFolder();
        File.WriteAllBytes(folder.File("idat.bin"), idat);
        File.WriteAllBytes(folder.File("rows.bin"), rows);
        OutsideReference.Run("""
            import zlib
            raw = zlib.decompress(open("idat.bin", "rb").read())
            rows = open("rows.bin", "rb").read()
            c = zlib.compressobj(1, zlib.DEFLATED, 15, 9, zlib.Z_HUFFMAN_ONLY)
            ref = c.compress(rows) + c.flush()
            json.dump({"same": raw == rows, "length": len(raw), "zlib": len(ref)}, open("out.json", "w"))
            """, folder.Path);
        using var result = System.Text.Json.JsonDocument.Parse(File.ReadAllText(folder.File("out.json")));
        Assert.Equal(rows.Length, result.RootElement.GetProperty("length").GetInt32());
        Assert.True(result.RootElement.GetProperty("same").GetBoolean(), $"{kind}: inflated bytes differ from the rows");
        // Optimal per-block codes: within 1% (plus header bytes) of zlib's Huffman-only stream.
        var zlibLength = result.RootElement.GetProperty("zlib").GetInt32();
        Assert.True(idat.Length <= zlibLength * 1.01 + 300, $"{kind}: ours {idat.Length} bytes, zlib Huffman-only {zlibLength}");
    }

    private static (byte[] Pixels, int Width, int Height) Make(string kind)
    {
        var rng = new Random(kind.Length);
        switch (kind)
        {
            case "one value":
                return (Enumerable.Repeat((byte)77, 40 * 3).ToArray(), 40, 3);
            case "two values":
                return (Enumerable.Range(0, 64 * 64).Select(i => (byte)(i % 3 == 0 ? 255 : 0)).ToArray(), 64, 64);
            case "all values":
                return (Enumerable.Range(0, 256 * 16).Select(i => (byte)i).ToArray(), 256, 16);
            case "fibonacci":
                // Counts growing as Fibonacci numbers make a Huffman tree deeper than deflate's 15 bits: the lengths must be limited.
                var list = new List<byte>();
                long a = 1, b = 1;
                for (var s = 0; s < 24; s++)
                {
                    for (var k = 0; k < a; k++) list.Add((byte)(s * 7));
                    (a, b) = (b, a + b);
                }
                var shuffled = list.OrderBy(_ => rng.Next()).ToList();
                var width = 250;
                while (shuffled.Count % width != 0) shuffled.Add(0);
                return (shuffled.ToArray(), width, shuffled.Count / width);
            case "noise":
                return (PngEncoderTests.NoisyLevels(256 * 256, 1, seed: 12), 256, 256);
            case "rare values":
                // Past 32 KiB a block's code is fitted to a sample of it: values seen once each, almost surely outside
                // the sample, must still have a code.
                var rare = PngEncoderTests.NoisyLevels(512 * 256, 1, seed: 14);
                for (var k = 0; k < 10; k++) rare[rng.Next(rare.Length)] = (byte)(k < 5 ? k : 250 + k);
                return (rare, 512, 256);
            case "rgb tile":
                // A colour tile's bytes as one gray image 768 wide: three channels of different levels interleaved.
                var rgb = PngEncoderTests.NoisyLevels(3 * 256 * 256, 1, seed: 15);
                for (var k = 0; k < rgb.Length; k += 3) { rgb[k + 1] = (byte)(rgb[k + 1] / 2); rgb[k + 2] = (byte)(255 - rgb[k + 2]); }
                return (rgb, 768, 256);
            default:
                return (PngEncoderTests.NoisyLevels(1200 * 900, 1, seed: 13), 1200, 900); // many blocks
        }
    }
}
