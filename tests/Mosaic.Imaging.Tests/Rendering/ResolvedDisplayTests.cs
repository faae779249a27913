using System.Globalization;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Tests.Display;

namespace Mosaic.Imaging.Tests.Rendering;

/// <summary>
/// The resolved display a client draws its colour bar from: the 256 values at t = i/255 must be the inverse of the
/// stretch, checked against astropy.visualization's own inverse stretches (Debian python3-astropy) and, for
/// histeq, against numpy's quantiles of the field's pixels.
/// </summary>
public sealed class ResolvedDisplayTests
{
    private const double Lo = 36, Hi = 1000;

    public static TheoryData<string, double> Stretches() => new()
    {
        { "linear", 0 }, { "sqrt", 0 }, { "power", 2.5 }, { "power", 0.4 }, { "log", 1000 }, { "log", 3 }, { "asinh", 20 }, { "asinh", 0.5 },
    };

    [Theory]
    [MemberData(nameof(Stretches))]
    public void Colour_bar_values_are_astropys_inverse_stretch(string name, double parameter)
    {
        IStretch stretch = name switch
        {
            "linear" => new LinearStretch(),
            "sqrt" => new SqrtStretch(),
            "power" => new PowerStretch(parameter),
            "log" => new LogStretch(parameter),
            _ => new AsinhStretch(Softening.Physical(parameter)),
        };
        var (statistics, histogram) = SyntheticSky.Statistics([0f, 1f]);
        var resolved = new DisplaySettings { Limits = new ManualLimits(Lo, Hi), Stretch = stretch }.Resolve(statistics, histogram);
        Assert.Equal(Lo, resolved.Lo);
        Assert.Equal(Hi, resolved.Hi);
        Assert.Equal(name, resolved.StretchName);

        using var folder = new TemporaryFolder();
        // astropy's AsinhStretch(a) after ManualInterval(lo, hi) is our asinh with pivot lo and a = soft/(hi - lo).
        var a = name == "asinh" ? parameter / (Hi - Lo) : parameter;
        File.WriteAllText(folder.File("cfg.json"), string.Create(CultureInfo.InvariantCulture, $$"""{"name": "{{name}}", "a": {{a:R}}}"""));
        OutsideReference.Run("""
            from astropy.visualization import SqrtStretch, PowerStretch, LogStretch
            cfg = json.load(open("cfg.json"))
            s = {"linear": lambda: LinearStretch(), "sqrt": lambda: SqrtStretch(), "power": lambda: PowerStretch(cfg["a"]),
                 "log": lambda: LogStretch(a=cfg["a"]), "asinh": lambda: AsinhStretch(a=cfg["a"])}[cfg["name"]]()
            t = np.arange(256) / 255.0
            np.asarray(s.inverse(t, clip=True), "<f8").tofile("u.f64")
            """, folder.Path);
        var u = OutsideReference.ReadFloat64(folder.File("u.f64"));
        var values = resolved.ColorbarValues;
        Assert.Equal(256, values.Length);
        for (var i = 0; i < 256; i++)
        {
            var expected = Lo + u[i] * (Hi - Lo);
            Assert.True(Math.Abs(values[i] - expected) <= 1e-9 * (Hi - Lo), $"{name}: colour bar value {i} is {values[i]:R}, astropy's inverse gives {expected:R}");
        }
    }

    [Fact]
    public void Asinh_parameters_resolve_to_physical_soft_and_pivot()
    {
        var sky = SyntheticSky.Make(300, 200, seed: 17);
        var (statistics, histogram) = SyntheticSky.Statistics(sky);
        var resolved = DisplaySettings.Default.Resolve(statistics, histogram);
        Assert.Equal("asinh", resolved.StretchName);
        Assert.Equal(3 * statistics.MadSigma, resolved.StretchParameters["soft"], 12);
        Assert.Equal(resolved.Lo, resolved.StretchParameters["pivot"]);
        var atMedian = (DisplaySettings.Default with { Stretch = new AsinhStretch(Softening.Sigmas(3), AsinhPivot.AtMedian) }).Resolve(statistics, histogram);
        Assert.Equal(statistics.Median, atMedian.StretchParameters["pivot"]);
        Assert.Equal(DisplaySettings.Default.CanonicalKey, resolved.CanonicalKey);
    }

    [Fact]
    public void Colour_bar_colours_are_the_palette_at_each_t_with_its_parameters()
    {
        var (statistics, histogram) = SyntheticSky.Statistics([0f, 1f]);
        var palette = new CubehelixPalette(1, 0.5, 1.2, 1.5);
        var resolved = new DisplaySettings { Limits = new ManualLimits(Lo, Hi), Palette = palette, Masked = MaskedColor.Parse("00ff00") }.Resolve(statistics, histogram);
        Assert.Equal("cubehelix", resolved.PaletteName);
        Assert.Equal(1.5, resolved.PaletteParameters["gamma"]);
        Assert.Equal(0.5, resolved.PaletteParameters["rotations"]);
        Assert.Equal("00ff00", resolved.Masked.CanonicalKey);
        for (var i = 0; i < 256; i++) Assert.Equal(palette.Color(i / 255.0), resolved.Colors[i]);
        Assert.NotEqual(resolved.Colors[0], resolved.Colors[255]);
    }

    [Fact]
    public void HistEq_colour_bar_values_are_numpys_quantiles_of_the_pixels_within_the_limits()
    {
        var sky = SyntheticSky.Make(400, 300, seed: 19);
        var (statistics, histogram) = SyntheticSky.Statistics(sky);
        const double lo = 30, hi = 500;
        var resolved = new DisplaySettings { Limits = new ManualLimits(lo, hi), Stretch = new HistEqStretch() }.Resolve(statistics, histogram);
        using var folder = new TemporaryFolder();
        OutsideReference.WriteFloat32(folder.File("values.f32"), sky);
        OutsideReference.Run("""
            v = np.fromfile("values.f32", dtype="<f4").astype(np.float64)
            v = np.sort(v[(v >= 30) & (v <= 500)])
            np.asarray(np.quantile(v, np.arange(256) / 255.0), "<f8").tofile("q.f64")
            gaps = np.array([v[min(v.size - 1, int(np.ceil(p * (v.size - 1))) + 1)] - v[max(0, int(np.floor(p * (v.size - 1))) - 1)]
                             for p in np.arange(256) / 255.0])
            gaps.astype("<f8").tofile("gaps.f64")
            """, folder.Path);
        var expected = OutsideReference.ReadFloat64(folder.File("q.f64"));
        var gaps = OutsideReference.ReadFloat64(folder.File("gaps.f64"));
        Assert.Equal(lo, resolved.ColorbarValues[0]);
        Assert.Equal(hi, resolved.ColorbarValues[255]);
        for (var i = 1; i < 255; i++)
        {
            // The histogram knows a quantile to its bin (relative width 2^-11) plus the gap between neighbouring pixels.
            var tolerance = 2 * Mosaic.Imaging.Statistics.ValueHistogram.RelativeBinWidth * Math.Abs(expected[i]) + gaps[i];
            Assert.True(Math.Abs(resolved.ColorbarValues[i] - expected[i]) <= tolerance,
                $"histeq colour bar value {i}: ours {resolved.ColorbarValues[i]:R}, numpy quantile {expected[i]:R}");
        }
    }
}
