using Mosaic.Imaging.Composite;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Colors;
using Mosaic.Imaging.Tests.Display;

namespace Mosaic.Imaging.Tests.Composite;

/// <summary>
/// The Lupton composite against astropy.visualization.make_lupton_rgb (Debian python3-astropy), the published
/// implementation of Lupton et al. (2004, PASP 116, 133), on synthetic float32 bands: every channel of every
/// unmasked pixel within 1 DN, as decoded from our PNG by ImageSharp.
/// </summary>
public sealed class LuptonReferenceTests
{
    // make_lupton_rgb has no weights: (v - m) * s is passed as the image with minimum 0, which is the same arithmetic.
    private const string Script = """
        from astropy.visualization import make_lupton_rgb
        w, h = int(sys.argv[1]), int(sys.argv[2])
        p = json.loads(sys.argv[3])
        bands = [np.fromfile(f"{c}.f32", dtype=np.float32).reshape(h, w) for c in "rgb"]
        scaled = [((b - np.float32(m)) * np.float32(s)).astype(np.float32) for b, m, s in zip(bands, p["min"], p["scale"])]
        rgb = make_lupton_rgb(*scaled, minimum=0, stretch=p["range"], Q=p["q"])
        rgb.astype(np.uint8).tofile("reference.u8")
        print(rgb.shape[0] * rgb.shape[1])
        """;

    public static TheoryData<double, double, double[], double[]> Settings() => new()
    {
        // q, range, min (r, g, b), scale (r, g, b)
        { 8, 60, [32, 30, 21], [1, 1, 1] },
        { 0.5, 400, [30, 30, 30], [1, 1, 1] },
        { 40, 15, [25, 28, 18], [0.6, 1.3, 2.2] },
        { 1e-3, 2000, [0, 0, 0], [1, 1, 1] },
    };

    [Theory]
    [MemberData(nameof(Settings))]
    public void Every_channel_agrees_with_make_lupton_rgb_within_1_DN(double q, double range, double[] min, double[] scale)
    {
        // 301 wide: the vector loop's scalar tail runs on every row.
        const int width = 301, height = 173;
        var bands = CompositeImages.Bands(width, height);
        var settings = new LuptonSettings(q, range, Triple(min), Triple(scale));
        var map = settings.Compile(Channels(bands));
        var png = CompositeRenderer.RenderPng(bands[0], bands[1], bands[2], width, height, map, MaskedColor.Transparent);
        var ours = CompositeImages.Rgba(png, out var w, out var h);
        Assert.Equal((width, height), (w, h));
        var reference = Reference(bands, width, height, q, range, min, scale);

        var worst = 0;
        var differing = 0;
        for (var i = 0; i < width * height; i++)
        {
            for (var c = 0; c < 3; c++)
            {
                var d = Math.Abs(ours[4 * i + c] - reference[3 * i + c]);
                worst = Math.Max(worst, d);
                if (d > 0) differing++;
            }
            Assert.Equal(255, ours[4 * i + 3]);
        }
        Assert.True(worst <= 1, $"largest difference {worst} DN");
        // Not a constant image: the scene spans most of the 8-bit scale in every channel.
        for (var c = 0; c < 3; c++)
        {
            var levels = Enumerable.Range(0, width * height).Select(i => reference[3 * i + c]).Distinct().Count();
            Assert.True(levels > 60, $"channel {c} shows only {levels} levels");
        }
        Assert.True(differing < width * height * 3 / 100, $"{differing} channel values differ by 1 DN");
    }

    [Fact]
    public void Saturated_pixels_keep_the_hue_of_their_bands()
    {
        const int width = 256, height = 256;
        var bands = CompositeImages.Bands(width, height);
        var min = new Channels<double>(32, 30, 21);
        var map = new LuptonSettings(8, 60, min).Compile(Channels(bands));
        var ours = CompositeImages.Rgba(CompositeRenderer.RenderPng(bands[0], bands[1], bands[2], width, height, map, MaskedColor.Transparent), out _, out _);
        var reference = Reference(bands, width, height, 8, 60, [32, 30, 21], [1, 1, 1]);
        var saturated = 0;
        for (var i = 0; i < width * height; i++)
        {
            var x = new[] { bands[0][i] - 32.0, bands[1][i] - 30.0, bands[2][i] - 21.0 };
            var largest = x.Max();
            if (largest < 1e4 || x.Min() <= 0) continue;
            saturated++;
            // Lupton et al. (2004) section 3.2: where a channel passes 1 all are divided by the largest, so the
            // channels stay in the ratio of the inputs; 8 bits truncate (numpy astype), hence [255 x / max - 1, 255 x / max].
            for (var c = 0; c < 3; c++)
            {
                var exact = 255 * x[c] / largest;
                Assert.InRange(ours[4 * i + c], exact - 1 - 1e-6, exact + 0.01);
                Assert.InRange(ours[4 * i + c], reference[3 * i + c] - 1, reference[3 * i + c] + 1);
            }
            // The largest channel is 255 x / x, which float32 may leave a hair under 255 before truncating (astropy too).
            Assert.InRange(Math.Max(ours[4 * i], Math.Max(ours[4 * i + 1], ours[4 * i + 2])), 254, 255);
        }
        Assert.True(saturated >= 50, $"only {saturated} saturated pixels");
    }

    [Fact]
    public void A_pixel_masked_in_any_band_is_transparent_or_the_masked_colour()
    {
        const int width = 256, height = 256;
        var bands = CompositeImages.Bands(width, height, holesIn: 1);
        var map = new LuptonSettings(8, 60).Compile(Channels(bands));
        var clear = CompositeImages.Rgba(CompositeRenderer.RenderPng(bands[0], bands[1], bands[2], width, height, map, MaskedColor.Transparent), out _, out _);
        var coloured = CompositeImages.Rgba(CompositeRenderer.RenderPng(bands[0], bands[1], bands[2], width, height, map, MaskedColor.Of(new Rgb(0, 255, 128))), out _, out _);
        var masked = 0;
        for (var i = 0; i < width * height; i++)
        {
            var isMasked = float.IsNaN(bands[1][i]);
            if (isMasked) masked++;
            // Transparent: alpha 0 (PNG colour type 6, W3C PNG 2003 section 6.1); opaque: the colour, alpha 255.
            Assert.Equal(isMasked ? 0 : 255, clear[4 * i + 3]);
            if (isMasked) Assert.Equal(new byte[] { 0, 255, 128, 255 }, coloured.AsSpan(4 * i, 4).ToArray());
            else Assert.Equal(clear.AsSpan(4 * i, 4).ToArray(), coloured.AsSpan(4 * i, 4).ToArray());
        }
        Assert.True(masked >= 100);
    }

    [Fact]
    public void The_defaults_are_each_median_and_ten_mean_MAD_sigmas()
    {
        var bands = CompositeImages.Bands(200, 150);
        var resolved = new LuptonSettings().Resolve(Channels(bands)).Lupton!;
        // numpy.median and astropy.stats.mad_std of the same values; the histogram-based statistics are exact to one bin.
        using var folder = Write(bands);
        var json = OutsideReference.Run("""
            from astropy.stats import mad_std
            bands = [np.fromfile(f"{c}.f32", dtype=np.float32) for c in "rgb"]
            print(json.dumps({"median": [float(np.median(b)) for b in bands], "sigma": [float(mad_std(b)) for b in bands]}))
            """, folder.Path);
        {
            var reference = System.Text.Json.JsonDocument.Parse(json).RootElement;
            var sigmas = reference.GetProperty("sigma").EnumerateArray().Select(e => e.GetDouble()).ToArray();
            for (var c = 0; c < 3; c++)
                Assert.Equal(reference.GetProperty("median")[c].GetDouble(), resolved.Minimum[c], 0.05);
            Assert.Equal(LuptonSettings.DefaultRangeSigmas * sigmas.Average(), resolved.Range, 0.01 * resolved.Range);
            Assert.Equal(LuptonSettings.DefaultQ, resolved.Q);
        }
    }

    [Fact]
    public void Bad_numbers_are_refused_naming_them_and_equal_settings_share_a_key()
    {
        Assert.Equal("q", Assert.Throws<ArgumentOutOfRangeException>(() => new LuptonSettings(q: 0)).ParamName);
        Assert.Equal("q", Assert.Throws<ArgumentOutOfRangeException>(() => new LuptonSettings(q: double.NaN)).ParamName);
        Assert.Equal("q", Assert.Throws<ArgumentOutOfRangeException>(() => new LuptonSettings(q: 1e-9)).ParamName);
        Assert.Equal("range", Assert.Throws<ArgumentOutOfRangeException>(() => new LuptonSettings(range: -1)).ParamName);
        Assert.Equal("range", Assert.Throws<ArgumentOutOfRangeException>(() => new LuptonSettings(range: 1e-300)).ParamName);
        Assert.Equal("minimum", Assert.Throws<ArgumentOutOfRangeException>(() => new LuptonSettings(minimum: new(0, double.PositiveInfinity, 0))).ParamName);
        Assert.Equal("scale", Assert.Throws<ArgumentOutOfRangeException>(() => new LuptonSettings(scale: new(1, 0, 1))).ParamName);
        Assert.Equal(new LuptonSettings().CanonicalKey, new LuptonSettings(8, null, null, new(1, 1, 1), MaskedColor.Transparent).CanonicalKey);
        Assert.NotEqual(new LuptonSettings().CanonicalKey, new LuptonSettings(q: 9).CanonicalKey);
        Assert.NotEqual(new LuptonSettings().CanonicalKey, new LuptonSettings(scale: new(1, 1, 2)).CanonicalKey);
        // astropy's AsinhMapping clamps Q to 1e10: so do we, in the key too.
        Assert.Equal(new LuptonSettings(q: 1e10).CanonicalKey, new LuptonSettings(q: 1e12).CanonicalKey);
    }

    internal static Channels<ChannelBand> Channels(float[][] bands)
    {
        var stats = bands.Select(b => SyntheticSky.Statistics(b)).ToArray();
        return new Channels<ChannelBand>(
            new ChannelBand(stats[0].Statistics, stats[0].Histogram),
            new ChannelBand(stats[1].Statistics, stats[1].Histogram),
            new ChannelBand(stats[2].Statistics, stats[2].Histogram));
    }

    private static Channels<double> Triple(double[] values) => new(values[0], values[1], values[2]);

    internal static TemporaryFolder Write(float[][] bands)
    {
        var folder = new TemporaryFolder();
        for (var c = 0; c < 3; c++) OutsideReference.WriteFloat32(folder.File($"{"rgb"[c]}.f32"), bands[c]);
        return folder;
    }

    private static byte[] Reference(float[][] bands, int width, int height, double q, double range, double[] min, double[] scale)
    {
        using var folder = Write(bands);
        var parameters = System.Text.Json.JsonSerializer.Serialize(new { q, range, min, scale });
        var printed = Mosaic.Testing.DebianPython.RunCode(OutsideReferencePrelude + Script,
            [width.ToString(System.Globalization.CultureInfo.InvariantCulture), height.ToString(System.Globalization.CultureInfo.InvariantCulture), parameters],
            workingDirectory: folder.Path);
        Assert.Equal(width * height, int.Parse(printed.Trim(), System.Globalization.CultureInfo.InvariantCulture));
        return File.ReadAllBytes(folder.File("reference.u8"));
    }

    private const string OutsideReferencePrelude = "import sys, json\nimport numpy as np\n";
}
