using System.Globalization;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Rendering;

namespace Mosaic.Imaging.Tests.Display;

/// <summary>
/// Our stretches against astropy.visualization (Debian python3-astropy). With pivot c = lo and x = (v - lo)/(hi - lo):
/// asinh((v - lo)/soft) = asinh(x (hi - lo)/soft) = asinh(x / a) with a = soft/(hi - lo), f(lo) = 0 and
/// f(hi) = asinh(1/a), so our t = (f(v) - f(lo))/(f(hi) - f(lo)) is exactly astropy's AsinhStretch(a), which
/// divides by asinh(1/a), applied after ManualInterval(lo, hi) with clipping. The levels must be within 1 DN of 255 y.
/// </summary>
public sealed class StretchReferenceTests
{
    private const string Script = """
        x = np.fromfile("values.f32", dtype="<f4").astype(np.float64)
        cfg = json.load(open("config.json"))
        u = ManualInterval(cfg["lo"], cfg["hi"])(x, clip=True)
        from astropy.visualization import SqrtStretch, PowerStretch, LogStretch, HistEqStretch
        name = cfg["stretch"]
        if name == "asinh":
            y = AsinhStretch(a=cfg["a"])(u, clip=True)
        elif name == "sqrt":
            y = SqrtStretch()(u, clip=True)
        elif name == "power":
            y = PowerStretch(cfg["a"])(u, clip=True)
        elif name == "log":
            y = LogStretch(a=cfg["a"])(u, clip=True)
        elif name == "histeq":
            # astropy equalises over the data it is given: the field's finite pixels within [lo, hi], normalised.
            d = np.fromfile("field.f32", dtype="<f4").astype(np.float64)
            d = d[np.isfinite(d) & (d >= cfg["lo"]) & (d <= cfg["hi"])]
            y = HistEqStretch(ManualInterval(cfg["lo"], cfg["hi"])(d, clip=True))(u, clip=True)
        else:
            y = LinearStretch()(u, clip=True)
        np.asarray(y, "<f8").tofile("expected.f64")
        print(astropy.__version__)
        """;

    [Theory]
    [InlineData(36.0, 1000.0, 36.0)]
    [InlineData(-5.0, 5.0, 0.5)]
    [InlineData(1000.0, 1100.0, 100.0)]
    [InlineData(0.0, 65535.0, 3.0)]
    [InlineData(-2.0e-3, 7.5e-2, 1.0e-4)]
    [InlineData(0.0, 65535.0, 0.5)] // too steep for any table: served from level breakpoints
    public void Asinh_with_pivot_at_lo_matches_astropy_AsinhStretch(double lo, double hi, double soft)
    {
        var settings = new DisplaySettings { Limits = new ManualLimits(lo, hi), Stretch = new AsinhStretch(Softening.Physical(soft)) };
        AssertMatchesAstropy(settings, lo, hi, "asinh", soft / (hi - lo));
    }

    [Theory]
    [InlineData(36.0, 1000.0)]
    [InlineData(-5.0, 5.0)]
    [InlineData(1.0e6, 1.0e6 + 3.0)]
    public void Linear_matches_astropy_LinearStretch(double lo, double hi)
    {
        var settings = new DisplaySettings { Limits = new ManualLimits(lo, hi), Stretch = new LinearStretch() };
        AssertMatchesAstropy(settings, lo, hi, "linear", 0);
    }

    [Theory]
    [InlineData(36.0, 1000.0)]
    [InlineData(-5.0, 5.0)]
    [InlineData(0.0, 65535.0)] // steep at u = 0: table grows or breakpoints serve it
    public void Sqrt_matches_astropy_SqrtStretch(double lo, double hi)
    {
        var settings = new DisplaySettings { Limits = new ManualLimits(lo, hi), Stretch = new SqrtStretch() };
        AssertMatchesAstropy(settings, lo, hi, "sqrt", 0);
    }

    [Theory]
    [InlineData(36.0, 1000.0, 2.0)]
    [InlineData(-5.0, 5.0, 0.5)]
    [InlineData(0.0, 65535.0, 3.7)]
    [InlineData(0.0, 100.0, 0.1)]
    public void Power_matches_astropy_PowerStretch(double lo, double hi, double gamma)
    {
        var settings = new DisplaySettings { Limits = new ManualLimits(lo, hi), Stretch = new PowerStretch(gamma) };
        AssertMatchesAstropy(settings, lo, hi, "power", gamma);
    }

    [Theory]
    [InlineData(36.0, 1000.0, 1000.0)]
    [InlineData(-5.0, 5.0, 10.0)]
    [InlineData(0.0, 65535.0, 1.0e5)]
    [InlineData(0.0, 1.0, 0.01)]
    public void Log_matches_astropy_LogStretch(double lo, double hi, double a)
    {
        var settings = new DisplaySettings { Limits = new ManualLimits(lo, hi), Stretch = new LogStretch(a) };
        AssertMatchesAstropy(settings, lo, hi, "log", a);
    }

    [Theory]
    [InlineData(20.0, 400.0)]
    [InlineData(50.0, 90.0)]
    public void HistEq_matches_astropy_HistEqStretch_on_the_fields_pixels(double below, double above)
    {
        var sky = SyntheticSky.Make(400, 300, seed: 11, holes: true);
        // astropy rescales the data it equalises to its own min..max: limits at pixel values make that the identity.
        double lo = sky.Where(v => v >= below).Min(), hi = sky.Where(v => v <= above).Max();
        var (statistics, histogram) = SyntheticSky.Statistics(sky);
        var settings = new DisplaySettings { Limits = new ManualLimits(lo, hi), Stretch = new HistEqStretch() };
        var toneMap = settings.Compile(statistics, histogram);
        var values = Probe(lo, hi).Concat(sky.Where(v => !float.IsNaN(v)).Take(30000)).ToArray();
        AssertMatchesAstropy(toneMap, values, lo, hi, "histeq", 0, sky);
    }

    [Fact]
    public void Asinh_pivot_at_the_median_matches_the_contract_formula_evaluated_by_numpy()
    {
        // astropy has no asinh with an offset pivot; numpy evaluates the contract's formula
        // t = (asinh((v - c)/soft) - asinh((lo - c)/soft)) / (asinh((hi - c)/soft) - asinh((lo - c)/soft)), c = median.
        var sky = SyntheticSky.Make(300, 200, seed: 13);
        var (statistics, histogram) = SyntheticSky.Statistics(sky);
        const double lo = 20, hi = 2000, soft = 30;
        var settings = new DisplaySettings { Limits = new ManualLimits(lo, hi), Stretch = new AsinhStretch(Softening.Physical(soft), AsinhPivot.AtMedian) };
        var toneMap = settings.Compile(statistics, histogram);
        var values = Probe(lo, hi);
        using var folder = new TemporaryFolder();
        OutsideReference.WriteFloat32(folder.File("values.f32"), values);
        File.WriteAllText(folder.File("config.json"), string.Create(CultureInfo.InvariantCulture,
            $$"""{"lo": {{lo:R}}, "hi": {{hi:R}}, "soft": {{soft:R}}, "c": {{statistics.Median:R}}}"""));
        OutsideReference.Run("""
            x = np.fromfile("values.f32", dtype="<f4").astype(np.float64)
            cfg = json.load(open("config.json"))
            f = lambda v: np.arcsinh((v - cfg["c"]) / cfg["soft"])
            v = np.clip(x, cfg["lo"], cfg["hi"])
            t = np.clip((f(v) - f(cfg["lo"])) / (f(cfg["hi"]) - f(cfg["lo"])), 0, 1)
            t.astype("<f8").tofile("expected.f64")
            """, folder.Path);
        var expected = OutsideReference.ReadFloat64(folder.File("expected.f64"));
        var levels = new byte[values.Length];
        toneMap.Apply(values, levels);
        for (var i = 0; i < values.Length; i++)
            Assert.True(Math.Abs(levels[i] - 255 * expected[i]) <= 1, $"v = {values[i]:R}: level {levels[i]}, numpy 255 t = {255 * expected[i]:F3}");
        // The median is not lo, so the pivot made a difference: mid-grey falls elsewhere than with pivot lo.
        var atLo = (settings with { Stretch = new AsinhStretch(Softening.Physical(soft)) }).Compile(statistics, histogram);
        Assert.NotEqual(atLo.LevelOf((float)statistics.Median + 40), toneMap.LevelOf((float)statistics.Median + 40));
    }

    [Fact]
    public void Default_display_matches_astropy_with_the_fields_own_limits()
    {
        // The default with limits and softening resolved from our field statistics is the same astropy asinh:
        // a = 3 sigma / (hi - lo), pivot lo.
        var sky = SyntheticSky.Make(400, 300, seed: 5);
        var (statistics, histogram) = SyntheticSky.Statistics(sky);
        var limits = DisplaySettings.Default.Limits.Resolve(statistics, histogram);
        var toneMap = DisplaySettings.Default.Compile(statistics, histogram);
        Assert.Equal(limits.Lo, toneMap.Lo);
        Assert.Equal(limits.Hi, toneMap.Hi);
        AssertMatchesAstropy(toneMap, Probe(limits.Lo, limits.Hi).Concat(sky.Take(20000)).ToArray(), limits.Lo, limits.Hi, "asinh",
            DisplaySettings.DefaultSoftSigmas * statistics.MadSigma / (limits.Hi - limits.Lo));
    }

    private static void AssertMatchesAstropy(DisplaySettings settings, double lo, double hi, string stretch, double a)
    {
        // Statistics do not matter with manual limits and physical softening.
        var (statistics, histogram) = SyntheticSky.Statistics([0f, 1f]);
        AssertMatchesAstropy(settings.Compile(statistics, histogram), Probe(lo, hi), lo, hi, stretch, a);
    }

    private static void AssertMatchesAstropy(ToneMap toneMap, float[] values, double lo, double hi, string stretch, double a, float[]? field = null)
    {
        using var folder = new TemporaryFolder();
        if (field is not null) OutsideReference.WriteFloat32(folder.File("field.f32"), field);
        OutsideReference.WriteFloat32(folder.File("values.f32"), values);
        File.WriteAllText(folder.File("config.json"), string.Create(CultureInfo.InvariantCulture,
            $$"""{"lo": {{lo:R}}, "hi": {{hi:R}}, "a": {{a:R}}, "stretch": "{{stretch}}"}"""));
        OutsideReference.Run(Script, folder.Path);
        var expected = OutsideReference.ReadFloat64(folder.File("expected.f64"));
        Assert.Equal(values.Length, expected.Length);

        var levels = new byte[values.Length];
        Assert.Equal(0, toneMap.Apply(values, levels));
        var worst = 0.0;
        var worstAt = 0;
        var unrounded = 0;
        for (var i = 0; i < values.Length; i++)
        {
            var error = Math.Abs(levels[i] - 255 * expected[i]);
            if (error > worst) (worst, worstAt) = (error, i);
            if (levels[i] != Math.Round(255 * expected[i], MidpointRounding.AwayFromZero)) unrounded++;
        }
        Assert.True(worst <= 1.0, $"level {levels[worstAt]} for v = {values[worstAt]:R} is {worst:F3} DN from astropy's 255 y = {255 * expected[worstAt]:F3}");
        // Within 1 DN alone would let a systematic offset (truncating instead of rounding: about half the values)
        // through. The table misses the rounded level only where its step straddles a rounding edge: a share of about
        // 255 x slope / (4 x entries) where the curve is steepest, some 4% of sky pixels for the default display.
        Assert.True(unrounded <= 0.08 * values.Length, $"{unrounded} of {values.Length} levels differ from round(255 y)");
    }

    /// <summary>Values across and beyond the limits, the limits themselves, and dense points near lo where asinh is steepest.</summary>
    private static float[] Probe(double lo, double hi)
    {
        var width = hi - lo;
        var values = new List<float> { (float)lo, (float)hi, float.MaxValue, float.MinValue, float.PositiveInfinity, float.NegativeInfinity };
        for (var i = 0; i <= 6000; i++) values.Add((float)(lo - 0.5 * width + 2.0 * width * i / 6000));
        for (var i = 0; i <= 4000; i++) values.Add((float)(lo + width * Math.Pow(i / 4000.0, 3)));
        var rng = new Random(3);
        for (var i = 0; i < 20000; i++) values.Add((float)(lo + width * rng.NextDouble()));
        return [.. values.Where(v => !float.IsNaN(v))];
    }
}
