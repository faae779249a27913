using System.Text.Json;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Colors;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Rendering;
using Mosaic.Imaging.Tests.Display;
using Mosaic.Imaging.Tests.Encoding;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Imaging.Tests.Rendering;

/// <summary>
/// Colour palettes and masked colours through the PNG encoder, decoded by ImageSharp 2.1.13 and by Pillow (Debian
/// python3-pil): every pixel must come back as the palette's colour for its value, masked pixels as asked.
/// </summary>
public sealed class ColorRenderingTests
{
    private const int T = TileRenderer.TilePixels;
    private const double Lo = 0, Hi = 400;

    [Fact]
    public void Colour_palette_tiles_are_indexed_with_the_palette_colour_of_each_value()
    {
        var palette = new CubehelixPalette();
        var map = ToneMap.Create(new ValueRange(Lo, Hi), new LinearStretch(), palette);
        var tile = Ramp(256, 256);
        var png = TileRenderer.RenderPng(tile, map);
        // IHDR colour type (PNG specification table 11.1): 3 = indexed; PLTE of 256 entries; no tRNS without masked pixels.
        Assert.Equal(3, png[25]);
        var chunks = PngChunks.Read(png);
        Assert.Equal(768, chunks.Single(c => c.Type == "PLTE").Data.Length);
        Assert.DoesNotContain(chunks, c => c.Type == "tRNS");
        using var image = Image.Load<Rgba32>(png);
        for (var i = 0; i < tile.Length; i++)
        {
            var p = image[i % 256, i / 256];
            // Linear: t = (v - lo)/(hi - lo); colour palettes show 255 steps, index k = 1 + round(254 t) at t = (k - 1)/254.
            var t = Math.Clamp((tile[i] - Lo) / (Hi - Lo), 0, 1);
            var k = (int)Math.Round(254 * t, MidpointRounding.AwayFromZero);
            var near = new[] { k - 1, k, k + 1 }.Where(j => j is >= 0 and <= 254).Select(j => palette.Color(j / 254.0)).ToArray();
            Assert.Contains(new Rgb(p.R, p.G, p.B), near);
            Assert.Equal(255, p.A);
        }
    }

    [Fact]
    public void Masked_pixels_of_colour_tiles_are_transparent_or_the_masked_colour()
    {
        var palette = PaletteCatalog.Create("glacier");
        var tile = Ramp(256, 256);
        for (var i = 0; i < T; i += 7) tile[i] = float.NaN;
        var clear = ToneMap.Create(new ValueRange(Lo, Hi), new LinearStretch(), palette);
        var coloured = ToneMap.Create(new ValueRange(Lo, Hi), new LinearStretch(), palette, MaskedColor.Parse("ff00ff"));

        var clearPng = TileRenderer.RenderPng(tile, clear);
        Assert.Equal(3, clearPng[25]);
        Assert.Equal([0], PngChunks.Read(clearPng).Single(c => c.Type == "tRNS").Data);
        using (var image = Image.Load<Rgba32>(clearPng))
            for (var i = 0; i < T; i++)
                Assert.Equal(float.IsNaN(tile[i]) ? 0 : 255, image[i % 256, i / 256].A);

        var colouredPng = TileRenderer.RenderPng(tile, coloured);
        Assert.DoesNotContain(PngChunks.Read(colouredPng), c => c.Type == "tRNS");
        using (var image = Image.Load<Rgba32>(colouredPng))
            for (var i = 0; i < T; i++)
            {
                var p = image[i % 256, i / 256];
                if (float.IsNaN(tile[i])) Assert.Equal(new Rgba32(255, 0, 255, 255), p);
                else Assert.NotEqual(new Rgba32(255, 0, 255, 255), p);
            }
    }

    [Fact]
    public void Gray_with_a_masked_colour_is_RGB_where_something_is_masked_and_gray_otherwise()
    {
        var map = ToneMap.Create(new ValueRange(Lo, Hi), new LinearStretch(), new GrayPalette(), MaskedColor.Parse("00ff80"));
        var tile = Ramp(256, 256);
        Assert.Equal(0, TileRenderer.RenderPng(tile, map)[25]);
        tile[5] = float.NaN;
        tile[T - 1] = float.NaN;
        var png = TileRenderer.RenderPng(tile, map);
        Assert.Equal(2, png[25]); // truecolour
        using var image = Image.Load<Rgb24>(png);
        for (var i = 0; i < T; i++)
        {
            var p = image[i % 256, i / 256];
            if (float.IsNaN(tile[i])) Assert.Equal(new Rgb24(0, 255, 128), p);
            else
            {
                // The contract's gray: DN = round(255 t), within 1 DN.
                var dn = 255 * Math.Clamp((tile[i] - Lo) / (Hi - Lo), 0, 1);
                Assert.True(p.R == p.G && p.G == p.B && Math.Abs(p.R - dn) <= 1, $"pixel {i}: {p} for DN {dn:F2}");
            }
        }
    }

    [Theory]
    [InlineData(1, 1)]
    [InlineData(300, 7)]
    [InlineData(7, 300)]
    [InlineData(1500, 1100)] // many deflate batches
    public void Region_renders_any_size_top_row_first(int width, int height)
    {
        var values = Ramp(width, height);
        var map = ToneMap.Create(new ValueRange(Lo, Hi), new LinearStretch(), new GrayPalette());
        var png = RegionRenderer.RenderPng(values, width, height, map, MaskedColor.Transparent);
        using var image = Image.Load<L8>(png);
        Assert.Equal(width, image.Width);
        Assert.Equal(height, image.Height);
        for (var y = 0; y < height; y += Math.Max(1, height / 50))
            for (var x = 0; x < width; x++)
            {
                var dn = 255 * Math.Clamp((values[y * width + x] - Lo) / (Hi - Lo), 0, 1);
                Assert.True(Math.Abs(image[x, y].PackedValue - dn) <= 1, $"({x}, {y}): {image[x, y].PackedValue} for DN {dn:F2}");
            }
    }

    [Fact]
    public void Region_over_50_megapixels_or_of_the_wrong_length_is_refused()
    {
        var map = ToneMap.Create(new ValueRange(Lo, Hi), new LinearStretch(), new GrayPalette());
        Assert.Throws<ArgumentOutOfRangeException>(() => RegionRenderer.RenderPng([], 10_000, 5_001, map, MaskedColor.Transparent));
        Assert.Throws<ArgumentException>(() => RegionRenderer.RenderPng(new float[10], 3, 3, map, MaskedColor.Transparent));
        Assert.Throws<ArgumentOutOfRangeException>(() => RegionRenderer.RenderPng(new float[10], 0, 3, map, MaskedColor.Transparent));
    }

    [Fact]
    public void Pillow_decodes_every_kind_to_the_expected_colours()
    {
        const int width = 97, height = 41;
        var values = Ramp(width, height);
        for (var i = 3; i < values.Length; i += 11) values[i] = float.NaN;
        var ember = PaletteCatalog.Create("ember");
        var cases = new (string Name, IPalette Palette, MaskedColor Masked, string Mode)[]
        {
            ("gray_alpha", new GrayPalette(), MaskedColor.Transparent, "LA"),
            ("gray_rgb", new InvertedGrayPalette(), MaskedColor.Parse("ff00ff"), "RGB"),
            ("indexed_clear", ember, MaskedColor.Transparent, "P"),
            ("indexed_colour", ember, MaskedColor.Parse("0000ff"), "P"),
        };
        using var folder = new TemporaryFolder();
        var maps = new Dictionary<string, ToneMap>();
        foreach (var c in cases)
        {
            var map = ToneMap.Create(new ValueRange(Lo, Hi), new SqrtStretch(), c.Palette);
            maps[c.Name] = map;
            File.WriteAllBytes(folder.File(c.Name + ".png"), RegionRenderer.RenderPng(values, width, height, map, c.Masked));
        }
        OutsideReference.Run("""
            out = {}
            for name in ("gray_alpha", "gray_rgb", "indexed_clear", "indexed_colour"):
                im = Image.open(name + ".png"); im.verify()
                im = Image.open(name + ".png"); im.load()
                out[name] = {"mode": im.mode, "rgba": im.convert("RGBA").tobytes().hex()}
            json.dump(out, open("seen.json", "w"))
            """, folder.Path);
        using var seen = JsonDocument.Parse(File.ReadAllText(folder.File("seen.json")));
        foreach (var c in cases)
        {
            var entry = seen.RootElement.GetProperty(c.Name);
            Assert.Equal(c.Mode, entry.GetProperty("mode").GetString());
            var rgba = Convert.FromHexString(entry.GetProperty("rgba").GetString()!);
            for (var i = 0; i < values.Length; i++)
            {
                var got = (rgba[4 * i], rgba[4 * i + 1], rgba[4 * i + 2], rgba[4 * i + 3]);
                if (float.IsNaN(values[i]))
                {
                    if (c.Masked.IsTransparent) Assert.Equal(0, got.Item4);
                    else Assert.Equal((c.Masked.Color.R, c.Masked.Color.G, c.Masked.Color.B, (byte)255), got);
                    continue;
                }
                // sqrt: t = sqrt(u); gray levels come from round(255 t), colour ones from index 1 + round(254 t).
                var t = Math.Sqrt(Math.Clamp((values[i] - Lo) / (Hi - Lo), 0, 1));
                var steps = c.Palette.IsGray ? 255 : 254;
                var k = (int)Math.Round(steps * t, MidpointRounding.AwayFromZero);
                var near = new[] { k - 1, k, k + 1 }.Where(j => j >= 0 && j <= steps).Select(j => c.Palette.Color(j / (double)steps)).ToArray();
                Assert.Contains(new Rgb(got.Item1, got.Item2, got.Item3), near);
                Assert.Equal(255, got.Item4);
            }
        }
    }

    // Values from below lo to above hi along each row, changing with the row too, so a flipped image would show.
    private static float[] Ramp(int width, int height)
    {
        var values = new float[width * height];
        for (var y = 0; y < height; y++)
            for (var x = 0; x < width; x++)
                values[y * width + x] = (float)(-20 + 440.0 * ((x + 0.37 * y) % Math.Max(1, width)) / Math.Max(1, width - 1) * (1 + 0.1 * y / Math.Max(1, height)));
        return values;
    }
}
