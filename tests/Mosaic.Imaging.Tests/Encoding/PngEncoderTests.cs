using System.Buffers.Binary;
using Mosaic.Imaging.Encoding;
using SixLabors.ImageSharp;
using SixLabors.ImageSharp.PixelFormats;

namespace Mosaic.Imaging.Tests.Encoding;

/// <summary>Our PNGs decoded by an outside decoder, ImageSharp 2.1.13, must give back the exact pixels.</summary>
public sealed class PngEncoderTests
{
    public static TheoryData<int, int, PngCompression> Sizes()
    {
        var data = new TheoryData<int, int, PngCompression>();
        foreach (var compression in Enum.GetValues<PngCompression>())
            foreach (var (w, h) in new[] { (1, 1), (5, 3), (3, 5), (256, 256), (300, 7), (1, 700) })
                data.Add(w, h, compression);
        return data;
    }

    [Theory]
    [MemberData(nameof(Sizes))]
    public void Gray_decodes_to_the_same_pixels(int width, int height, PngCompression compression)
    {
        var pixels = NoisyLevels(width * height, 1, seed: width * 31 + height);
        var png = PngEncoder.EncodeGray(pixels, width, height, compression);
        using var image = Image.Load<L8>(png);
        Assert.Equal(width, image.Width);
        Assert.Equal(height, image.Height);
        for (var y = 0; y < height; y++)
            for (var x = 0; x < width; x++)
                Assert.Equal(pixels[y * width + x], image[x, y].PackedValue);
    }

    [Theory]
    [MemberData(nameof(Sizes))]
    public void Gray_alpha_decodes_to_the_same_pixels(int width, int height, PngCompression compression)
    {
        var pixels = NoisyLevels(width * height * 2, 2, seed: width * 17 + height);
        var png = PngEncoder.EncodeGrayAlpha(pixels, width, height, compression);
        using var image = Image.Load<La16>(png);
        Assert.Equal(width, image.Width);
        Assert.Equal(height, image.Height);
        for (var y = 0; y < height; y++)
            for (var x = 0; x < width; x++)
            {
                var i = 2 * (y * width + x);
                Assert.Equal(pixels[i], image[x, y].L);
                Assert.Equal(pixels[i + 1], image[x, y].A);
            }
    }

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void Chunks_follow_the_specification(bool alpha)
    {
        const int width = 37, height = 11;
        var channels = alpha ? 2 : 1;
        var png = alpha
            ? PngEncoder.EncodeGrayAlpha(NoisyLevels(width * height * 2, 2, 1), width, height)
            : PngEncoder.EncodeGray(NoisyLevels(width * height, 1, 1), width, height);
        var chunks = PngChunks.Read(png);
        // PNG specification sections 5.6 and 11.2: IHDR first, IDAT, IEND last (empty); IHDR is 13 bytes.
        Assert.Equal(["IHDR", "IDAT", "IEND"], chunks.Select(c => c.Type));
        var ihdr = chunks[0].Data;
        Assert.Equal(13, ihdr.Length);
        Assert.Equal(width, BinaryPrimitives.ReadInt32BigEndian(ihdr));
        Assert.Equal(height, BinaryPrimitives.ReadInt32BigEndian(ihdr.AsSpan(4)));
        Assert.Equal(8, ihdr[8]);                     // bit depth
        Assert.Equal(alpha ? 4 : 0, ihdr[9]);         // colour type: 0 greyscale, 4 greyscale with alpha
        Assert.Equal([0, 0, 0], ihdr[10..13]);        // deflate, adaptive filtering, no interlace
        Assert.Empty(chunks[2].Data);
        foreach (var (type, data, crc) in chunks)
            Assert.Equal(PngChunks.BitwiseCrc([.. System.Text.Encoding.ASCII.GetBytes(type), .. data]), crc);

        // The zlib stream (RFC 1950) inflates to one filter-type byte of 0 before each row (section 9.2).
        using var inflated = new MemoryStream();
        using (var zlib = new System.IO.Compression.ZLibStream(new MemoryStream(chunks[1].Data), System.IO.Compression.CompressionMode.Decompress))
            zlib.CopyTo(inflated);
        var raw = inflated.ToArray();
        Assert.Equal(height * (1 + width * channels), raw.Length);
        for (var y = 0; y < height; y++) Assert.Equal(0, raw[y * (1 + width * channels)]);
    }

    [Fact]
    public void Huffman_coding_shrinks_noisy_sky_and_stored_does_not()
    {
        // Levels with about 5.4 bits of entropy (Gaussian, sigma 10): Huffman coding alone must get well under 8 bits.
        var pixels = NoisyLevels(256 * 256, 1, seed: 9);
        var huffman = PngEncoder.EncodeGray(pixels, 256, 256);
        var fastest = PngEncoder.EncodeGray(pixels, 256, 256, PngCompression.Fastest);
        var stored = PngEncoder.EncodeGray(pixels, 256, 256, PngCompression.Stored);
        Assert.InRange(huffman.Length, 0.6 * pixels.Length, 0.8 * pixels.Length);
        // zlib level 1 with its default strategy (zlib-ng's quick deflate, static Huffman codes) hardly shrinks noise.
        Assert.InRange(fastest.Length, 0.6 * pixels.Length, stored.Length);
        Assert.True(stored.Length > pixels.Length + 256, "stored blocks carry every row and its filter byte");
    }

    [Fact]
    public void A_large_image_after_a_small_one_still_decodes_exactly()
    {
        // Pooled buffers are reused between calls: no leftover bytes may leak into the next image.
        var small = NoisyLevels(16, 1, 2);
        var large = NoisyLevels(1024 * 700, 1, 3);
        for (var round = 0; round < 3; round++)
        {
            using (var s = Image.Load<L8>(PngEncoder.EncodeGray(small, 4, 4))) Assert.Equal(small[15], s[3, 3].PackedValue);
            using var l = Image.Load<L8>(PngEncoder.EncodeGray(large, 1024, 700));
            Assert.Equal(large[699 * 1024 + 1023], l[1023, 699].PackedValue);
            Assert.Equal(large[350 * 1024 + 17], l[17, 350].PackedValue);
        }
    }

    [Theory]
    [InlineData(0, 1, 0, "width")]
    [InlineData(-1, 1, 0, "width")]
    [InlineData(1, 0, 0, "height")]
    [InlineData(2, 2, 3, "pixels")]
    [InlineData(2, 2, 5, "pixels")]
    public void Bad_sizes_are_refused_naming_the_parameter(int width, int height, int length, string parameter)
    {
        var error = Assert.ThrowsAny<ArgumentException>(() => PngEncoder.EncodeGray(new byte[length], width, height));
        Assert.Equal(parameter, error.ParamName);
        var alpha = Assert.ThrowsAny<ArgumentException>(() => PngEncoder.EncodeGrayAlpha(new byte[length * 2], width, height));
        Assert.Equal(parameter, alpha.ParamName);
    }

    [Fact]
    public void An_unknown_compression_is_refused()
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => PngEncoder.EncodeGray(new byte[1], 1, 1, (PngCompression)99));
        Assert.Equal("compression", error.ParamName);
    }

    /// <summary>Gaussian levels around 100 (sigma 10); every second byte opaque-or-clear alpha when channels is 2.</summary>
    internal static byte[] NoisyLevels(int length, int channels, int seed)
    {
        var rng = new Random(seed);
        var bytes = new byte[length];
        for (var i = 0; i < length; i++)
        {
            if (channels == 2 && i % 2 == 1) { bytes[i] = rng.Next(5) == 0 ? (byte)0 : (byte)255; continue; }
            var g = Math.Sqrt(-2 * Math.Log(1 - rng.NextDouble())) * Math.Cos(2 * Math.PI * rng.NextDouble());
            bytes[i] = (byte)Math.Clamp(Math.Round(100 + 10 * g), 0, 255);
        }
        return bytes;
    }
}
