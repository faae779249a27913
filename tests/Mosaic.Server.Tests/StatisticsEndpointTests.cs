using System.Net;
using System.Net.Http.Json;
using System.Text.Json;

namespace Mosaic.Server.Tests;

public sealed class StatisticsEndpointTests(DisplayReference reference) : IClassFixture<DisplayReference>
{
    private HttpClient Client => reference.Client;

    private JsonElement Expected => reference.Expected;

    [Theory]
    [InlineData("single", "x0=15&y0=5&x1=30&y1=14", "singleBox", 0)]
    [InlineData("single", "x0=1&y0=1&x1=600&y1=300&hdu=0", "singleWhole", 0)]
    [InlineData("trio", "band=green&hdu=CCD2&x0=5&y0=3&x1=120&y1=90", "greenBox", 2)]
    public async Task Box_statistics_equal_numpy_on_the_same_pixels(string field, string query, string expectedName, int hdu)
    {
        var stats = await Client.GetFromJsonAsync<JsonElement>($"/api/fields/{field}/stats?{query}");
        // Reference: numpy (Debian python3-numpy) nanmedian / nanpercentile (linear rule) / count, and astropy.stats.mad_std
        // (Debian python3-astropy), over the box astropy.io.fits reads.
        var expected = Expected.GetProperty(expectedName);
        Assert.True(stats.GetProperty("exact").GetBoolean());
        Assert.Equal(hdu, stats.GetProperty("hdu").GetInt32());
        Assert.Equal(expected.GetProperty("count").GetInt64(), stats.GetProperty("count").GetInt64());
        Assert.Equal(expected.GetProperty("masked").GetInt64(), stats.GetProperty("masked").GetInt64());
        foreach (var name in new[] { "min", "max", "median" })
            Assert.Equal(expected.GetProperty(name).GetDouble(), stats.GetProperty(name).GetDouble(), Relative(expected.GetProperty(name).GetDouble(), 1e-12));
        Assert.Equal(expected.GetProperty("mean").GetDouble(), stats.GetProperty("mean").GetDouble(), Relative(expected.GetProperty("mean").GetDouble(), 1e-9));
        // mad_std scales by 1/Φ⁻¹(3/4) = 1.482602...; the server's 1.4826 (common practice) differs by 1.5e-6 of the value.
        Assert.Equal(expected.GetProperty("madSigma").GetDouble(), stats.GetProperty("madSigma").GetDouble(), Relative(expected.GetProperty("madSigma").GetDouble(), 1e-5));
        var percentiles = stats.GetProperty("percentiles");
        foreach (var p in expected.GetProperty("percentiles").EnumerateObject())
            Assert.Equal(p.Value.GetDouble(), percentiles.GetProperty(p.Name).GetDouble(), Relative(p.Value.GetDouble(), 1e-9));
        Assert.Equal(expected.GetProperty("percentiles").EnumerateObject().Count(), percentiles.EnumerateObject().Count());
    }

    [Fact]
    public async Task Field_wide_statistics_cover_every_HDU_of_the_band_within_the_histogram_precision()
    {
        var stats = await Client.GetFromJsonAsync<JsonElement>("/api/fields/trio/stats?band=red");
        var expected = Expected.GetProperty("redField");
        Assert.False(stats.GetProperty("exact").GetBoolean());
        Assert.Equal(JsonValueKind.Null, stats.GetProperty("hdu").ValueKind);
        Assert.Equal(JsonValueKind.Null, stats.GetProperty("box").ValueKind);
        // numpy over both chips of trio_red.fits: counts and extremes are exact in the histogram.
        Assert.Equal(expected.GetProperty("count").GetInt64(), stats.GetProperty("count").GetInt64());
        Assert.Equal(expected.GetProperty("masked").GetInt64(), stats.GetProperty("masked").GetInt64());
        Assert.Equal(expected.GetProperty("min").GetDouble(), stats.GetProperty("min").GetDouble(), 1e-9);
        Assert.Equal(expected.GetProperty("max").GetDouble(), stats.GetProperty("max").GetDouble(), 1e-9);
        Assert.Equal(expected.GetProperty("mean").GetDouble(), stats.GetProperty("mean").GetDouble(), 1e-6);
        AssertWithinRank(expected.GetProperty("median"), stats.GetProperty("median").GetDouble(), "median");
        foreach (var p in expected.GetProperty("percentiles").EnumerateObject())
            AssertWithinRank(p.Value, stats.GetProperty("percentiles").GetProperty(p.Name).GetDouble(), $"percentile {p.Name}");

        // MAD sigma: the median's own slack plus one histogram bin either side of median ± MAD (see AssertWithinRank).
        var median = expected.GetProperty("median");
        var mad = expected.GetProperty("mad").GetDouble();
        var slack = median[1].GetDouble() - median[0].GetDouble() + expected.GetProperty("madGap").GetDouble()
                    + 2 * DisplayReference.HistogramPrecision * (Math.Abs(median[2].GetDouble()) + mad);
        Assert.InRange(stats.GetProperty("madSigma").GetDouble(), 1.4826 * (mad - slack), 1.4826 * (mad + slack));
    }

    [Fact]
    public async Task Histogram_counts_match_numpy_histogram_within_the_pixels_of_the_fine_bins_at_each_edge()
    {
        var expected = Expected.GetProperty("redHistogram");
        var histogram = await Client.GetFromJsonAsync<JsonElement>("/api/fields/trio/histogram?band=red&lo=30&hi=120&bins=45");
        var counts = histogram.GetProperty("counts").EnumerateArray().Select(c => c.GetInt64()).ToArray();
        var numpy = expected.GetProperty("counts").EnumerateArray().Select(c => c.GetInt64()).ToArray();
        var slack = expected.GetProperty("edgeSlack").EnumerateArray().Select(c => c.GetInt64()).ToArray();
        Assert.Equal(45, histogram.GetProperty("bins").GetInt32());
        Assert.Equal(numpy.Length, counts.Length);
        Assert.Equal(46, histogram.GetProperty("edges").GetArrayLength());
        // numpy.histogram (Debian python3-numpy). A count may differ only by the pixels lying within one fine bin
        // (2^-11 of the value) of its two edges, which the server splits in proportion, plus 1 for rounding at each edge.
        for (var i = 0; i < counts.Length; i++)
            Assert.InRange(counts[i], numpy[i] - slack[i] - slack[i + 1] - 2, numpy[i] + slack[i] + slack[i + 1] + 2);
        Assert.InRange(histogram.GetProperty("below").GetInt64(), expected.GetProperty("below").GetInt64() - slack[0] - 1, expected.GetProperty("below").GetInt64() + slack[0] + 1);
        Assert.InRange(histogram.GetProperty("above").GetInt64(), expected.GetProperty("above").GetInt64() - slack[^1] - 1, expected.GetProperty("above").GetInt64() + slack[^1] + 1);
        // Every finite pixel is in exactly one of below, a bin, or above.
        Assert.Equal(Expected.GetProperty("redField").GetProperty("count").GetInt64(),
            counts.Sum() + histogram.GetProperty("below").GetInt64() + histogram.GetProperty("above").GetInt64());
        Assert.Equal(2, histogram.GetProperty("masked").GetInt64());
    }

    [Fact]
    public async Task Log_spaced_histograms_match_numpy_histogram_over_geomspace_edges()
    {
        var expected = Expected.GetProperty("redLogHistogram");
        var histogram = await Client.GetFromJsonAsync<JsonElement>("/api/fields/trio/histogram?band=red&lo=30&hi=120&bins=20&scale=log");
        Assert.Equal("log", histogram.GetProperty("scale").GetString());
        // numpy.geomspace edges and numpy.histogram counts (Debian python3-numpy), with the same edge slack as above.
        var edges = histogram.GetProperty("edges").EnumerateArray().Select(e => e.GetDouble()).ToArray();
        var numpyEdges = expected.GetProperty("edges").EnumerateArray().Select(e => e.GetDouble()).ToArray();
        Assert.Equal(numpyEdges.Length, edges.Length);
        for (var i = 0; i < edges.Length; i++) Assert.Equal(numpyEdges[i], edges[i], 1e-9 * numpyEdges[i]);
        var counts = histogram.GetProperty("counts").EnumerateArray().Select(c => c.GetInt64()).ToArray();
        var numpy = expected.GetProperty("counts").EnumerateArray().Select(c => c.GetInt64()).ToArray();
        var slack = expected.GetProperty("edgeSlack").EnumerateArray().Select(c => c.GetInt64()).ToArray();
        for (var i = 0; i < counts.Length; i++)
            Assert.InRange(counts[i], numpy[i] - slack[i] - slack[i + 1] - 2, numpy[i] + slack[i] + slack[i + 1] + 2);
    }

    [Theory]
    [InlineData("stretch=power&gamma=1.7", "power", "gamma", 1.7)]
    [InlineData("stretch=power", "power", "gamma", 2)]
    [InlineData("stretch=log&a=250", "log", "a", 250)]
    [InlineData("stretch=log", "log", "a", 1000)]
    public async Task Display_reports_the_stretch_parameters_with_the_contract_defaults(string query, string name, string parameter, double value)
    {
        var display = await Client.GetFromJsonAsync<JsonElement>($"/api/fields/trio/display?band=red&lo=40&hi=110&{query}");
        var stretch = display.GetProperty("stretch");
        Assert.Equal(name, stretch.GetProperty("name").GetString());
        Assert.Equal(value, stretch.GetProperty(parameter).GetDouble());
        // The colour bar inverts the contract's formula: power t = u^gamma, log t = ln(1 + a u)/ln(1 + a).
        var values = display.GetProperty("colorbar").GetProperty("values").EnumerateArray().Select(v => v.GetDouble()).ToArray();
        for (var i = 0; i < 256; i += 17)
        {
            var u = (values[i] - 40) / 70;
            var t = name == "power" ? Math.Pow(u, value) : Math.Log(1 + value * u) / Math.Log(1 + value);
            Assert.Equal(i / 255.0, t, 1e-6);
        }
    }

    [Fact]
    public async Task Histogram_defaults_to_256_bins_over_the_default_display_limits()
    {
        var histogram = await Client.GetFromJsonAsync<JsonElement>("/api/fields/trio/histogram?band=red");
        var display = await Client.GetFromJsonAsync<JsonElement>("/api/fields/trio/display?band=red");
        Assert.Equal(256, histogram.GetProperty("counts").GetArrayLength());
        Assert.Equal(display.GetProperty("lo").GetDouble(), histogram.GetProperty("lo").GetDouble());
        Assert.Equal(display.GetProperty("hi").GetDouble(), histogram.GetProperty("hi").GetDouble());
        var total = histogram.GetProperty("counts").EnumerateArray().Sum(c => c.GetInt64())
                    + histogram.GetProperty("below").GetInt64() + histogram.GetProperty("above").GetInt64();
        Assert.Equal(Expected.GetProperty("redField").GetProperty("count").GetInt64(), total);
    }

    [Fact]
    public async Task Display_limits_by_percentile_equal_numpy_percentiles_of_the_whole_band()
    {
        var display = await Client.GetFromJsonAsync<JsonElement>("/api/fields/trio/display?band=red&plo=1&phi=99&stretch=linear");
        var expected = Expected.GetProperty("redField");
        AssertWithinRank(expected.GetProperty("p1"), display.GetProperty("lo").GetDouble(), "lo at plo=1");
        AssertWithinRank(expected.GetProperty("p99"), display.GetProperty("hi").GetDouble(), "hi at phi=99");
        Assert.Equal("linear", display.GetProperty("stretch").GetProperty("name").GetString());
        Assert.Equal("gray", display.GetProperty("palette").GetProperty("name").GetString());
        Assert.Equal("transparent", display.GetProperty("masked").GetString());

        // Linear stretch: t = u, so v_i = lo + (i / 255)(hi - lo) (the contract's formula, inverted); gray DN = i.
        double lo = display.GetProperty("lo").GetDouble(), hi = display.GetProperty("hi").GetDouble();
        var values = display.GetProperty("colorbar").GetProperty("values").EnumerateArray().Select(v => v.GetDouble()).ToArray();
        var colors = display.GetProperty("colorbar").GetProperty("colors").EnumerateArray().Select(c => c.GetString()).ToArray();
        Assert.Equal(256, values.Length);
        Assert.Equal(256, colors.Length);
        for (var i = 0; i < 256; i++)
        {
            Assert.Equal(lo + i / 255.0 * (hi - lo), values[i], 1e-9 * (hi - lo));
            Assert.Equal($"{i:x2}{i:x2}{i:x2}", colors[i]);
        }
    }

    [Fact]
    public async Task Display_resolves_asinh_soft_and_the_median_pivot_as_physical_numbers()
    {
        var display = await Client.GetFromJsonAsync<JsonElement>("/api/fields/trio/display?band=red&stretch=asinh&soft=4.5&pivot=median&lo=40&hi=110");
        var stats = await Client.GetFromJsonAsync<JsonElement>("/api/fields/trio/stats?band=red");
        Assert.Equal(40, display.GetProperty("lo").GetDouble());
        Assert.Equal(110, display.GetProperty("hi").GetDouble());
        var stretch = display.GetProperty("stretch");
        Assert.Equal("asinh", stretch.GetProperty("name").GetString());
        Assert.Equal(4.5, stretch.GetProperty("soft").GetDouble());
        Assert.Equal(stats.GetProperty("median").GetDouble(), stretch.GetProperty("pivot").GetDouble());
        // The contract's asinh: f(v) = asinh((v - c)/soft), t = (f(v) - f(lo))/(f(hi) - f(lo)); the colour bar inverts it.
        var c = stats.GetProperty("median").GetDouble();
        double F(double v) => Math.Asinh((v - c) / 4.5);
        var values = display.GetProperty("colorbar").GetProperty("values").EnumerateArray().Select(v => v.GetDouble()).ToArray();
        for (var i = 0; i < 256; i += 15)
            Assert.Equal(i / 255.0, (F(values[i]) - F(40)) / (F(110) - F(40)), 1e-6);
    }

    [Fact]
    public async Task Palettes_list_gray_inverted_gray_and_cubehelix_with_256_colours()
    {
        var palettes = await Client.GetFromJsonAsync<JsonElement>("/api/palettes");
        var byName = palettes.EnumerateArray().ToDictionary(p => p.GetProperty("name").GetString()!);
        Assert.Contains("cubehelix", byName.Keys);
        foreach (var palette in byName.Values)
        {
            Assert.Equal(256, palette.GetProperty("colors").GetArrayLength());
            Assert.False(string.IsNullOrWhiteSpace(palette.GetProperty("label").GetString()));
        }
        // The contract: gray DN = round(255 t), so entry i (t = i/255) is level i; inverted gray is 255 - i.
        var gray = byName["gray"].GetProperty("colors").EnumerateArray().Select(c => c.GetString()).ToArray();
        var inverted = byName["gray-inv"].GetProperty("colors").EnumerateArray().Select(c => c.GetString()).ToArray();
        for (var i = 0; i < 256; i++)
        {
            Assert.Equal($"{i:x2}{i:x2}{i:x2}", gray[i]);
            Assert.Equal($"{255 - i:x2}{255 - i:x2}{255 - i:x2}", inverted[i]);
        }
        var cubehelix = byName["cubehelix"].GetProperty("parameters").EnumerateArray().Select(p => p.GetProperty("name").GetString()!).ToArray();
        Assert.Equal(["ch-start", "ch-rot", "ch-hue", "ch-gamma"], cubehelix);
    }

    [Fact]
    public async Task Field_wide_statistics_ignore_the_hdu_but_an_unknown_one_is_404()
    {
        var named = await Client.GetFromJsonAsync<JsonElement>("/api/fields/trio/stats?band=red&hdu=CCD2");
        Assert.Equal(Expected.GetProperty("redField").GetProperty("count").GetInt64(), named.GetProperty("count").GetInt64());
        Assert.Equal(JsonValueKind.Null, named.GetProperty("hdu").ValueKind);
        var unknown = await Client.GetAsync("/api/fields/trio/stats?band=red&hdu=CCD9");
        Assert.Equal(HttpStatusCode.NotFound, unknown.StatusCode);
        Assert.Equal("hdu", (await unknown.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("parameter").GetString());
    }

    [Fact]
    public async Task A_box_without_hdu_is_refused_where_the_bands_have_several_HDUs()
    {
        var response = await Client.GetAsync("/api/fields/trio/stats?band=red&x0=1&y0=1&x1=10&y1=10");
        Assert.Equal(HttpStatusCode.BadRequest, response.StatusCode);
        Assert.Equal("hdu", (await response.Content.ReadFromJsonAsync<JsonElement>()).GetProperty("parameter").GetString());
    }

    private static double Relative(double value, double share) => Math.Max(Math.Abs(value) * share, 1e-12);

    /// <summary>
    /// [below, above, numpy]: the sorted values at floor and ceil of the rank p (n - 1) and numpy's interpolation
    /// between them. A histogram quantile lies in the fine bin of one of them (2^-11 of the value wide), so it
    /// must fall between them widened by one bin.
    /// </summary>
    private static void AssertWithinRank(JsonElement bracket, double actual, string what)
    {
        double below = bracket[0].GetDouble(), above = bracket[1].GetDouble();
        var bin = DisplayReference.HistogramPrecision * Math.Max(Math.Abs(below), Math.Abs(above));
        Assert.True(actual >= below - bin && actual <= above + bin,
            $"{what}: {actual} is outside numpy's neighbours [{below}, {above}] widened by one histogram bin ({bin})");
    }
}
