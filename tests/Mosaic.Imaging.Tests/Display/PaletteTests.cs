using System.Globalization;
using System.Text.Json;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Colors;
using Mosaic.Imaging.Display.Palettes;

namespace Mosaic.Imaging.Tests.Display;

public sealed class PaletteTests
{
    public static TheoryData<string> Names() => [.. PaletteCatalog.Names];

    [Fact]
    public void Catalog_offers_gray_inverted_gray_cubehelix_and_our_own_ramps()
    {
        Assert.Equal(["gray", "gray-inv", "cubehelix", "ember", "glacier", "lichen"], PaletteCatalog.Names);
        foreach (var name in PaletteCatalog.Names)
        {
            var palette = PaletteCatalog.Create(name);
            Assert.Equal(name, palette.Name);
            Assert.False(string.IsNullOrWhiteSpace(PaletteCatalog.Label(name)));
        }
        Assert.IsType<GrayPalette>(PaletteCatalog.Create("gray"));
        Assert.IsType<InvertedGrayPalette>(PaletteCatalog.Create("gray-inv"));
        Assert.Equal(new CubehelixPalette(0.5, -1.5, 1, 1), PaletteCatalog.Create("cubehelix"));
        Assert.Equal(new CubehelixPalette(1, 2, 0.5, 3), PaletteCatalog.Create("cubehelix", new CubehelixParameters(1, 2, 0.5, 3)));
    }

    [Theory]
    [InlineData("grey")]
    [InlineData("Gray")]
    [InlineData("")]
    public void Unknown_palette_names_are_refused_naming_palette(string name)
    {
        var error = Assert.Throws<ArgumentException>(() => PaletteCatalog.Create(name));
        Assert.Equal("palette", error.ParamName);
        Assert.Equal("palette", Assert.Throws<ArgumentException>(() => PaletteCatalog.Label(name)).ParamName);
        Assert.Equal("palette", Assert.Throws<ArgumentException>(() => PaletteCatalog.Create("gray", CubehelixParameters.Default)).ParamName);
    }

    [Theory]
    [InlineData(-0.1, 0, 1, 1, "start")]
    [InlineData(3.1, 0, 1, 1, "start")]
    [InlineData(1, -10.5, 1, 1, "rotations")]
    [InlineData(1, 11, 1, 1, "rotations")]
    [InlineData(1, 0, -0.5, 1, "hue")]
    [InlineData(1, 0, 3.5, 1, "hue")]
    [InlineData(1, 0, 1, 0, "gamma")]
    [InlineData(1, 0, 1, 10.5, "gamma")]
    [InlineData(double.NaN, 0, 1, 1, "start")]
    [InlineData(1, 0, 1, double.PositiveInfinity, "gamma")]
    public void Cubehelix_parameters_out_of_range_are_refused_naming_the_parameter(double start, double rotations, double hue, double gamma, string parameter)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => new CubehelixPalette(start, rotations, hue, gamma));
        Assert.Equal(parameter, error.ParamName);
    }

    [Fact]
    public void Gray_is_round_255_t_and_inverted_gray_its_complement()
    {
        // The contract's gray: DN = round(255 t).
        foreach (var t in new[] { 0.0, 1e-9, 0.5 / 255, 0.25, 0.5, 1.0, -3, 7 })
        {
            var dn = (byte)Math.Round(255 * Math.Clamp(t, 0, 1), MidpointRounding.AwayFromZero);
            Assert.Equal(new Rgb(dn, dn, dn), new GrayPalette().Color(t));
            Assert.Equal(new Rgb((byte)(255 - dn), (byte)(255 - dn), (byte)(255 - dn)), new InvertedGrayPalette().Color(t));
        }
        Assert.True(new GrayPalette().IsGray);
        Assert.True(new InvertedGrayPalette().IsGray);
        Assert.False(new CubehelixPalette().IsGray);
        Assert.False(PaletteCatalog.Create("ember").IsGray);
    }

    [Theory]
    [InlineData(0.5, -1.5, 1.0, 1.0)]
    [InlineData(0.5, -1.5, 1.0, 2.0)]
    [InlineData(1.0, 1.0, 0.5, 1.0)]
    [InlineData(2.7, 3.3, 2.5, 0.6)]
    [InlineData(0.0, -10.0, 3.0, 10.0)]
    public void Cubehelix_matches_Green_2011_evaluated_by_numpy(double start, double rotations, double hue, double gamma)
    {
        // Green (2011), Bull. Astr. Soc. India 39, 289, eq. 2 as recalled: λ' = λ^γ, a = hue λ'(1 − λ')/2,
        // φ = 2π(start/3 + rotations λ), (R, G, B) = λ' + a M (cos φ, sin φ) with M = [[−0.14861, 1.78277],
        // [−0.29227, −0.90649], [1.97294, 0]], clipped to [0, 1]. Written out here in numpy, apart from our C#.
        using var folder = new TemporaryFolder();
        File.WriteAllText(folder.File("p.json"), string.Create(CultureInfo.InvariantCulture, $"[{start:R}, {rotations:R}, {hue:R}, {gamma:R}]"));
        OutsideReference.Run("""
            s, r, h, g = json.load(open("p.json"))
            lam = np.arange(256) / 255.0
            lg = lam ** g
            a = h * lg * (1 - lg) / 2
            phi = 2 * np.pi * (s / 3 + r * lam)
            rgb = lg[:, None] + a[:, None] * np.stack([
                -0.14861 * np.cos(phi) + 1.78277 * np.sin(phi),
                -0.29227 * np.cos(phi) - 0.90649 * np.sin(phi),
                1.97294 * np.cos(phi)], axis=1)
            json.dump((255 * np.clip(rgb, 0, 1)).tolist(), open("rgb.json", "w"))
            """, folder.Path);
        var expected = JsonSerializer.Deserialize<double[][]>(File.ReadAllText(folder.File("rgb.json")))!;
        var palette = new CubehelixPalette(start, rotations, hue, gamma);
        for (var i = 0; i < 256; i++)
        {
            var c = palette.Color(i / 255.0);
            // Within half a step: only the rounding to 8 bits differs.
            Assert.True(Math.Abs(c.R - expected[i][0]) <= 0.5 + 1e-9 && Math.Abs(c.G - expected[i][1]) <= 0.5 + 1e-9 && Math.Abs(c.B - expected[i][2]) <= 0.5 + 1e-9,
                $"entry {i}: ours {c}, paper ({expected[i][0]:F2}, {expected[i][1]:F2}, {expected[i][2]:F2})");
        }
    }

    [Theory]
    [MemberData(nameof(Names))]
    public void Every_palette_rises_in_lightness(string name)
    {
        var palette = PaletteCatalog.Create(name);
        var lightness = Enumerable.Range(0, 256).Select(i => Lightness(palette.Color(i / 255.0))).ToArray();
        // gray-inv is monotone the other way round (falling); all others rise from dark to light.
        var sign = name == "gray-inv" ? -1 : 1;
        for (var i = 1; i < 256; i++)
        {
            // 0.05 L*: the 8-bit rounding of cubehelix's channels wobbles by a few hundredths where its brightness
            // rises slowest (Green's design brightness is exactly monotone; checked below).
            Assert.True(sign * (lightness[i] - lightness[i - 1]) >= -0.05, $"{name}: L* {lightness[i - 1]:F3} then {lightness[i]:F3} at entry {i}");
        }
        Assert.True(sign * (lightness[255] - lightness[0]) > 80, $"{name} spans L* {lightness[0]:F1} to {lightness[255]:F1}");
        if (name == "cubehelix")
        {
            // Green (2011): the perceived brightness 0.30 R + 0.59 G + 0.11 B of the helix is λ^γ, monotone.
            var luma = Enumerable.Range(0, 256).Select(i => palette.Color(i / 255.0)).Select(c => 0.30 * c.R + 0.59 * c.G + 0.11 * c.B).ToArray();
            for (var i = 1; i < 256; i++) Assert.True(luma[i] >= luma[i - 1], $"cubehelix luma falls at entry {i}");
        }
    }

    [Theory]
    [MemberData(nameof(Names))]
    public void Default_masked_colour_is_far_from_every_palette_colour(string name)
    {
        var palette = PaletteCatalog.Create(name);
        var masked = Lab(palette.DefaultMaskedColor);
        var nearest = Enumerable.Range(0, 256).Min(i => Distance(masked, Lab(palette.Color(i / 255.0))));
        // CIE76 ΔE of 2.3 is about a just noticeable difference (common practice); 40 is unmistakable.
        Assert.True(nearest > 40, $"{name}: masked colour {palette.DefaultMaskedColor} is only ΔE {nearest:F1} from the palette");
    }

    [Fact]
    public void Default_masked_colour_is_found_for_any_cubehelix()
    {
        foreach (var p in new[] { new CubehelixParameters(0, 3, 3, 1), new CubehelixParameters(1.5, -0.5, 0.3, 0.7), new CubehelixParameters(3, 10, 2, 5) })
        {
            var palette = new CubehelixPalette(p);
            var masked = Lab(palette.DefaultMaskedColor);
            var nearest = Enumerable.Range(0, 256).Min(i => Distance(masked, Lab(palette.Color(i / 255.0))));
            Assert.True(nearest > 25, $"cubehelix {p}: masked colour {palette.DefaultMaskedColor} is only ΔE {nearest:F1} from the palette");
        }
    }

    [Theory]
    [InlineData("transparent", true, 0, 0, 0)]
    [InlineData("TRANSPARENT", true, 0, 0, 0)]
    [InlineData("ff00ff", false, 255, 0, 255)]
    [InlineData("00A0fF", false, 0, 160, 255)]
    [InlineData("123456", false, 0x12, 0x34, 0x56)]
    public void Masked_colour_parses_transparent_or_six_hex_digits(string text, bool transparent, byte r, byte g, byte b)
    {
        var masked = MaskedColor.Parse(text);
        Assert.Equal(transparent, masked.IsTransparent);
        if (!transparent) Assert.Equal(new Rgb(r, g, b), masked.Color);
        Assert.Equal(transparent ? "transparent" : text.ToLowerInvariant(), masked.CanonicalKey);
    }

    [Theory]
    [InlineData("#ff00ff")]
    [InlineData("ff00f")]
    [InlineData("ff00fff")]
    [InlineData("gg0000")]
    [InlineData("")]
    [InlineData("none")]
    [InlineData("+f00ff")]
    public void Masked_colour_refuses_anything_else_naming_masked(string text)
        => Assert.Equal("masked", Assert.Throws<ArgumentException>(() => MaskedColor.Parse(text)).ParamName);

    // sRGB to CIE 1976 L*a*b*, written out here from IEC 61966-2-1 (transfer curve, D65 matrix) and CIE 15:2004
    // (L* = 116 f(Y/Yn) − 16, f(x) = x^(1/3) above (6/29)^3), as recalled; apart from the library's own CieLab.
    private static double Lightness(Rgb c) => Lab(c).L;

    private static (double L, double A, double B) Lab(Rgb c)
    {
        static double Lin(byte v) { var x = v / 255.0; return x <= 0.04045 ? x / 12.92 : Math.Pow((x + 0.055) / 1.055, 2.4); }
        static double F(double x) => x > Math.Pow(6.0 / 29, 3) ? Math.Pow(x, 1.0 / 3) : x / (3 * Math.Pow(6.0 / 29, 2)) + 4.0 / 29;
        double r = Lin(c.R), g = Lin(c.G), b = Lin(c.B);
        var x = (0.4124564 * r + 0.3575761 * g + 0.1804375 * b) / 0.95047;
        var y = 0.2126729 * r + 0.7151522 * g + 0.0721750 * b;
        var z = (0.0193339 * r + 0.1191920 * g + 0.9503041 * b) / 1.08883;
        return (116 * F(y) - 16, 500 * (F(x) - F(y)), 200 * (F(y) - F(z)));
    }

    private static double Distance((double L, double A, double B) p, (double L, double A, double B) q)
        => Math.Sqrt((p.L - q.L) * (p.L - q.L) + (p.A - q.A) * (p.A - q.A) + (p.B - q.B) * (p.B - q.B));
}
