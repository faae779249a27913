using Mosaic.Imaging.Composite;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Tests.Display;

namespace Mosaic.Imaging.Tests.Composite;

/// <summary>
/// The per-band composite against astropy.visualization (Debian python3-astropy): each channel through
/// ManualInterval and its stretch (LinearStretch, LogStretch: log(a x + 1) / log(a + 1), SqrtStretch, PowerStretch:
/// x^a, as astropy documents them), times the channel's weight, clipped to [0, 1], round(255 t) — within 1 DN.
/// </summary>
public sealed class PerBandReferenceTests
{
    private const string Script = """
        from astropy.visualization import ManualInterval, LinearStretch, LogStretch, SqrtStretch, PowerStretch
        w, h = int(sys.argv[1]), int(sys.argv[2])
        channels = json.loads(sys.argv[3])
        out = np.zeros((h, w, 3), dtype=np.uint8)
        for c, p in enumerate(channels):
            v = np.fromfile(f"{'rgb'[c]}.f32", dtype=np.float32).reshape(h, w).astype(np.float64)
            u = ManualInterval(p["lo"], p["hi"])(np.nan_to_num(v, nan=p["lo"]), clip=True)
            stretch = {"linear": lambda: LinearStretch(), "log": lambda: LogStretch(a=p["a"]), "sqrt": lambda: SqrtStretch(), "power": lambda: PowerStretch(p["a"])}[p["stretch"]]()
            t = np.clip(stretch(u, clip=True) * p["scale"], 0, 1)
            out[..., c] = np.floor(255 * t + 0.5).astype(np.uint8)   # round half away from zero for t >= 0
        out.tofile("reference.u8")
        print(w * h)
        """;

    [Fact]
    public void Each_channel_follows_its_own_limits_stretch_and_weight_within_1_DN()
    {
        const int width = 259, height = 190;
        var bands = CompositeImages.Bands(width, height, holesIn: 2);
        var channels = new[]
        {
            new { lo = 20.0, hi = 900.0, stretch = "log", a = 300.0, scale = 1.0 },
            new { lo = 25.0, hi = 4000.0, stretch = "sqrt", a = 0.0, scale = 1.7 },
            new { lo = 0.0, hi = 300.0, stretch = "linear", a = 0.0, scale = 0.6 },
        };
        IStretch[] stretches = [new LogStretch(300), new SqrtStretch(), new LinearStretch()];
        var displays = Enumerable.Range(0, 3).Select(c => new DisplaySettings { Limits = new ManualLimits(channels[c].lo, channels[c].hi), Stretch = stretches[c] }).ToArray();
        var settings = new PerBandSettings(new Channels<DisplaySettings>(displays[0], displays[1], displays[2]),
            new Channels<double>(channels[0].scale, channels[1].scale, channels[2].scale));
        var map = settings.Compile(LuptonReferenceTests.Channels(bands));
        var ours = CompositeImages.Rgba(CompositeRenderer.RenderPng(bands[0], bands[1], bands[2], width, height, map, MaskedColor.Transparent), out _, out _);

        using var folder = LuptonReferenceTests.Write(bands);
        var printed = Mosaic.Testing.DebianPython.RunCode("import sys, json\nimport numpy as np\n" + Script,
            [width.ToString(System.Globalization.CultureInfo.InvariantCulture), height.ToString(System.Globalization.CultureInfo.InvariantCulture),
             System.Text.Json.JsonSerializer.Serialize(channels)], workingDirectory: folder.Path);
        Assert.Equal(width * height, int.Parse(printed.Trim(), System.Globalization.CultureInfo.InvariantCulture));
        var reference = File.ReadAllBytes(folder.File("reference.u8"));

        var worst = 0;
        var masked = 0;
        var saturatedGreen = 0;
        for (var i = 0; i < width * height; i++)
        {
            if (float.IsNaN(bands[2][i]))
            {
                masked++;
                Assert.Equal(0, ours[4 * i + 3]);
                continue;
            }
            Assert.Equal(255, ours[4 * i + 3]);
            for (var c = 0; c < 3; c++) worst = Math.Max(worst, Math.Abs(ours[4 * i + c] - reference[3 * i + c]));
            if (reference[3 * i + 1] == 255) saturatedGreen++;
        }
        Assert.True(worst <= 1, $"largest difference {worst} DN");
        Assert.True(masked >= 100, $"{masked} masked pixels");
        // The weight 1.7 pushes green's brighter pixels to the top level (t × scale clipped to 1).
        Assert.True(saturatedGreen > 50, $"{saturatedGreen} pixels at green 255");
    }

    [Fact]
    public void A_colour_palette_cannot_be_a_channel_and_keys_follow_the_channels()
    {
        var cubehelix = new DisplaySettings { Palette = new CubehelixPalette() };
        Assert.Equal("palette", Assert.Throws<ArgumentException>(() =>
            new PerBandSettings(new Channels<DisplaySettings>(DisplaySettings.Default, cubehelix, DisplaySettings.Default))).ParamName);
        var plain = new PerBandSettings(Channels<DisplaySettings>.All(DisplaySettings.Default));
        var logBlue = new PerBandSettings(new Channels<DisplaySettings>(DisplaySettings.Default, DisplaySettings.Default, DisplaySettings.Default with { Stretch = new LogStretch(10) }));
        Assert.Equal(plain.CanonicalKey, new PerBandSettings(Channels<DisplaySettings>.All(DisplaySettings.Default), new(1, 1, 1)).CanonicalKey);
        Assert.NotEqual(plain.CanonicalKey, logBlue.CanonicalKey);
        Assert.NotEqual(plain.CanonicalKey, new PerBandSettings(Channels<DisplaySettings>.All(DisplaySettings.Default), new(1, 2, 1)).CanonicalKey);
        Assert.DoesNotContain('/', logBlue.CanonicalKey);
        Assert.DoesNotContain(' ', logBlue.CanonicalKey);
    }
}
