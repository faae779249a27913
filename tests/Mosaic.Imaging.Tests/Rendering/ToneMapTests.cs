using System.Runtime.Intrinsics.X86;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Rendering;

namespace Mosaic.Imaging.Tests.Rendering;

public sealed class ToneMapTests
{
    /// <summary>(lo, hi, soft, pivot) from gentle to steeper than any table can follow.</summary>
    public static TheoryData<double, double, double, double> AsinhCases => new()
    {
        { 36, 200, 36, 36 },          // the default's shape on a sky-dominated field
        { 36, 4000, 36, 36 },         // a field with bright sources
        { 0, 65535, 3, 0 },           // steep: needs a large table
        { 0, 65535, 0.2, 0 },         // steeper than the largest table: exact breakpoints
        { -50, 950, 20, 100 },        // pivot inside the range: steepest mid-way
        { 1000, 1010, 0.05, 990 },    // pivot below the range
        { 5e5, 5e5 + 2000, 1, 5e5 },  // large offset: lo must keep its double precision
    };

    [Theory]
    [MemberData(nameof(AsinhCases))]
    public void Asinh_table_is_within_one_level_of_the_exact_formula(double lo, double hi, double soft, double pivot)
    {
        var toneMap = ToneMap.Create(new ValueRange(lo, hi), new AsinhCurve(lo, hi, soft, pivot), new GrayPalette());
        // The formula of the product design, evaluated here in double: u = clip((v - lo)/(hi - lo)),
        // f(v) = asinh((v - c)/soft), t = (f(lo + u (hi - lo)) - f(lo)) / (f(hi) - f(lo)), DN = round(255 t).
        double F(double v) => Math.Asinh((v - pivot) / soft);
        int Exact(float value)
        {
            var u = Math.Clamp((value - lo) / (hi - lo), 0, 1);
            var t = Math.Clamp((F(lo + u * (hi - lo)) - F(lo)) / (F(hi) - F(lo)), 0, 1);
            return (int)Math.Round(255 * t, MidpointRounding.AwayFromZero);
        }
        AssertWithinOneLevel(toneMap, lo, hi, Exact);
    }

    [Theory]
    [InlineData(0, 1)]
    [InlineData(-1e-3, 1e-3)]
    [InlineData(36, 4000)]
    public void Linear_table_is_within_one_level_of_the_exact_formula(double lo, double hi)
    {
        var toneMap = ToneMap.Create(new ValueRange(lo, hi), new LinearStretch(), new GrayPalette());
        // DN = round(255 clip((v - lo)/(hi - lo))).
        AssertWithinOneLevel(toneMap, lo, hi, v => (int)Math.Round(255 * Math.Clamp((v - lo) / (hi - lo), 0, 1), MidpointRounding.AwayFromZero));
    }

    [Fact]
    public void Steep_curves_grow_the_table_and_the_steepest_leave_it()
    {
        // asinh slope at the pivot is 1 / (a asinh(1/a)) with a = soft / (hi - lo); the table needs about 255 x slope entries.
        var gentle = ToneMap.Create(new ValueRange(0, 100), new AsinhCurve(0, 100, 10, 0), new GrayPalette());
        var steep = ToneMap.Create(new ValueRange(0, 65535), new AsinhCurve(0, 65535, 3, 0), new GrayPalette());
        var steepest = ToneMap.Create(new ValueRange(0, 65535), new AsinhCurve(0, 65535, 0.2, 0), new GrayPalette());
        Assert.Equal(ToneMap.DefaultEntries, gentle.TableEntries);
        Assert.InRange(steep.TableEntries, 255 * 2000 / 2, ToneMap.MaximumEntries);
        Assert.Equal(0, steepest.TableEntries);
    }

    [Theory]
    [InlineData(256)]
    [InlineData(ToneMap.DefaultEntries)]
    [InlineData(ToneMap.MaximumEntries)]
    public void Nan_is_masked_and_out_of_range_values_clip(int entries)
    {
        var toneMap = ToneMap.Create(new ValueRange(10, 20), new AsinhCurve(10, 20, 1, 10), new GrayPalette(), entries);
        float[] values = [float.NaN, 9.999f, -1e30f, float.NegativeInfinity, 10, 20, 20.001f, 1e30f, float.PositiveInfinity, float.NaN, 15];
        var levels = new byte[values.Length];
        Array.Fill(levels, (byte)77);
        Assert.Equal(2, toneMap.Apply(values, levels));
        Assert.Equal(0, levels[0]);
        Assert.Equal(0, levels[9]);
        // Below lo is black and above hi is white (u clipped to [0, 1], t(0) = 0 and t(1) = 1).
        Assert.Equal([0, 0, 0, 0, 255, 255, 255, 255], levels[1..9]);
        Assert.InRange(levels[10], 1, 254);
    }

    [Fact]
    public void Nan_is_masked_on_the_breakpoint_path_too()
    {
        var toneMap = ToneMap.Create(new ValueRange(0, 65535), new AsinhCurve(0, 65535, 0.2, 0), new GrayPalette());
        Assert.Equal(0, toneMap.TableEntries);
        float[] values = [float.NaN, -1, 0, 65535, 1e9f, float.NegativeInfinity, float.NaN];
        var levels = new byte[values.Length];
        Assert.Equal(2, toneMap.Apply(values, levels));
        Assert.Equal([0, 0, 0, 255, 255, 0, 0], levels);
    }

    [Theory]
    [InlineData(0)]
    [InlineData(1)]
    [InlineData(7)]
    [InlineData(15)]
    [InlineData(16)]
    [InlineData(17)]
    [InlineData(31)]
    [InlineData(33)]
    [InlineData(1001)]
    [InlineData(65536 + 5)]
    public void Every_loop_gives_the_same_levels_and_mask_count(int length)
    {
        var rng = new Random(length);
        var values = new float[length + 3];
        for (var i = 0; i < values.Length; i++)
            values[i] = rng.Next(20) == 0 ? float.NaN : (float)(rng.NextDouble() * 140 - 20);
        var toneMap = ToneMap.Create(new ValueRange(0, 100), new AsinhCurve(0, 100, 5, 0), new GrayPalette());
        // Offsets 0..3 so the vector loops also start unaligned; the scalar loop is the reference.
        for (var offset = 0; offset <= 3 && offset <= values.Length - length; offset++)
        {
            var slice = values.AsSpan(offset, length);
            var scalar = new byte[length];
            var scalarMasked = toneMap.Apply(slice, scalar, LookupPath.Scalar);
            Assert.Equal(slice.ToArray().Count(float.IsNaN), scalarMasked);
            var paths = new List<LookupPath> { LookupPath.Auto, LookupPath.Vector };
            if (Avx2.IsSupported) paths.Add(LookupPath.Gather);
            foreach (var path in paths)
            {
                var levels = new byte[length];
                Assert.Equal(scalarMasked, toneMap.Apply(slice, levels, path));
                Assert.Equal(scalar, levels);
            }
            for (var i = 0; i < length; i++) Assert.Equal(scalar[i], toneMap.LevelOf(slice[i]));
        }
    }

    [Fact]
    public void Levels_shorter_than_values_are_refused()
    {
        var toneMap = ToneMap.Create(new ValueRange(0, 1), new LinearStretch(), new GrayPalette());
        var error = Assert.Throws<ArgumentException>(() => toneMap.Apply(new float[10], new byte[9]));
        Assert.Equal("levels", error.ParamName);
    }

    [Theory]
    [InlineData(0)]
    [InlineData(128)]
    [InlineData(1000)]
    [InlineData(ToneMap.MaximumEntries * 2)]
    public void Table_sizes_must_be_powers_of_two_in_range(int entries)
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => ToneMap.Create(new ValueRange(0, 1), new LinearStretch(), new GrayPalette(), entries));
        Assert.Equal("minimumEntries", error.ParamName);
    }

    [Fact]
    public void Unusable_limits_are_refused()
    {
        var error = Assert.Throws<ArgumentOutOfRangeException>(() => ToneMap.Create(default, new LinearStretch(), new GrayPalette()));
        Assert.Equal("limits", error.ParamName);
    }

    private static void AssertWithinOneLevel(ToneMap toneMap, double lo, double hi, Func<float, int> exact)
    {
        var rng = new Random(1234);
        var width = hi - lo;
        var values = new float[300_000];
        for (var i = 0; i < values.Length; i++)
        {
            values[i] = (i % 3) switch
            {
                0 => (float)(lo - 0.1 * width + 1.2 * width * rng.NextDouble()),
                // Dense near lo, where asinh with a low pivot is steepest.
                1 => (float)(lo + width * Math.Pow(rng.NextDouble(), 4)),
                _ => (float)(lo + width * rng.NextDouble()),
            };
        }
        var levels = new byte[values.Length];
        toneMap.Apply(values, levels);
        var off = 0;
        for (var i = 0; i < values.Length; i++)
        {
            var expected = exact(values[i]);
            if (Math.Abs(levels[i] - expected) > 1)
                Assert.Fail($"v = {values[i]:R}: level {levels[i]}, exact {expected} (table entries {toneMap.TableEntries})");
            if (levels[i] != expected) off++;
        }
        // One level off happens only where a table step straddles a rounding edge (a share of about
        // 255 x slope / (4 x entries) where the curve is steepest), never systematically, as truncation would be.
        Assert.True(off <= 0.08 * values.Length, $"{off} of {values.Length} levels are one off the exact formula");
    }

    [Theory]
    [InlineData(20.0)] // table
    [InlineData(0.2)] // too steep for any table: level breakpoints
    public void Inverted_gray_is_255_minus_gray_on_every_path(double soft)
    {
        var range = new ValueRange(0, 65535);
        var curve = new AsinhCurve(0, 65535, soft, 0);
        var gray = ToneMap.Create(range, curve, new GrayPalette());
        var inverted = ToneMap.Create(range, curve, new Mosaic.Imaging.Display.Palettes.InvertedGrayPalette());
        Assert.Equal(gray.TableEntries == 0, inverted.TableEntries == 0);
        var values = Enumerable.Range(0, 70000).Select(i => (float)(i * i / 70000.0)).Append(float.NaN).ToArray();
        var g = new byte[values.Length];
        var v = new byte[values.Length];
        Assert.Equal(1, gray.Apply(values, g));
        Assert.Equal(1, inverted.Apply(values, v));
        for (var i = 0; i < values.Length - 1; i++) Assert.Equal(255 - g[i], v[i]);
    }
}
