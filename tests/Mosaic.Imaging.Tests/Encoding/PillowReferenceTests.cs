using Mosaic.Imaging.Encoding;
using Mosaic.Imaging.Tests.Display;

namespace Mosaic.Imaging.Tests.Encoding;

/// <summary>Pillow (Debian python3-pil) opens our PNGs, verifies their chunk CRCs, and reads the same mode and pixels.</summary>
public sealed class PillowReferenceTests
{
    private const string Script = """
        out = {}
        for name in ("gray", "gray_alpha"):
            im = Image.open(name + ".png"); im.verify()      # verify(): chunk CRCs and structure
            im = Image.open(name + ".png"); im.load()
            out[name] = {"mode": im.mode, "size": list(im.size), "format": im.format, "pixels": im.tobytes().hex()}
        json.dump(out, open("seen.json", "w"))
        """;

    [Fact]
    public void Pillow_reads_gray_as_L_and_gray_alpha_as_LA_with_the_same_pixels()
    {
        const int width = 61, height = 23;
        var gray = PngEncoderTests.NoisyLevels(width * height, 1, seed: 4);
        var grayAlpha = PngEncoderTests.NoisyLevels(width * height * 2, 2, seed: 5);
        using var folder = new TemporaryFolder();
        File.WriteAllBytes(folder.File("gray.png"), PngEncoder.EncodeGray(gray, width, height));
        File.WriteAllBytes(folder.File("gray_alpha.png"), PngEncoder.EncodeGrayAlpha(grayAlpha, width, height));
        OutsideReference.Run(Script, folder.Path);
        using var seen = System.Text.Json.JsonDocument.Parse(File.ReadAllText(folder.File("seen.json")));

        // Pillow's modes: "L" is 8-bit greyscale, "LA" greyscale with alpha; tobytes() is row-major, top row first.
        var l = seen.RootElement.GetProperty("gray");
        Assert.Equal("PNG", l.GetProperty("format").GetString());
        Assert.Equal("L", l.GetProperty("mode").GetString());
        Assert.Equal([width, height], l.GetProperty("size").EnumerateArray().Select(e => e.GetInt32()));
        Assert.Equal(Convert.ToHexStringLower(gray), l.GetProperty("pixels").GetString());

        var la = seen.RootElement.GetProperty("gray_alpha");
        Assert.Equal("LA", la.GetProperty("mode").GetString());
        Assert.Equal([width, height], la.GetProperty("size").EnumerateArray().Select(e => e.GetInt32()));
        Assert.Equal(Convert.ToHexStringLower(grayAlpha), la.GetProperty("pixels").GetString());
    }

    [Fact]
    public void Pillow_reads_a_colour_tile_as_RGB_with_the_same_pixels()
    {
        // 256 x 256 RGB (196 KiB of rows: its code comes from a sample), three channels at different levels and a
        // few values that occur once each.
        const int width = 256, height = 256;
        var rgb = PngEncoderTests.NoisyLevels(3 * width * height, 1, seed: 6);
        for (var k = 0; k < rgb.Length; k += 3) { rgb[k + 1] = (byte)(rgb[k + 1] / 2 + 20); rgb[k + 2] = (byte)(255 - rgb[k + 2]); }
        var rng = new Random(6);
        for (var k = 0; k < 12; k++) rgb[rng.Next(rgb.Length)] = (byte)(k < 6 ? k : 240 + k);
        using var folder = new TemporaryFolder();
        File.WriteAllBytes(folder.File("rgb.png"), PngEncoder.EncodeRgb(rgb, width, height));
        OutsideReference.Run("""
            im = Image.open("rgb.png"); im.verify()
            im = Image.open("rgb.png"); im.load()
            json.dump({"mode": im.mode, "size": list(im.size), "pixels": im.tobytes().hex()}, open("seen.json", "w"))
            """, folder.Path);
        using var seen = System.Text.Json.JsonDocument.Parse(File.ReadAllText(folder.File("seen.json")));
        // Pillow's "RGB" mode: 3 bytes a pixel, r, g, b, row-major from the top.
        Assert.Equal("RGB", seen.RootElement.GetProperty("mode").GetString());
        Assert.Equal([width, height], seen.RootElement.GetProperty("size").EnumerateArray().Select(e => e.GetInt32()));
        Assert.Equal(Convert.ToHexStringLower(rgb), seen.RootElement.GetProperty("pixels").GetString());
    }
}
