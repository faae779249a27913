using System.Net;
using System.Text.Json;

namespace Mosaic.Server.Tests.BandFiles;

/// <summary>
/// How a folder's files and extensions become bands of chips: by FILTER where a header has one, else by the
/// file-name rule the README documents; unreadable files listed, the rest served. Pixel values and counts are
/// checked against astropy.io.fits and numpy (Debian python3-astropy, python3-numpy).
/// </summary>
public sealed class BandGroupingTests(BandFilesFixture data) : IClassFixture<BandFilesFixture>
{
    private static IEnumerable<string?> Strings(JsonElement array, string property) =>
        array.EnumerateArray().Select(e => e.GetProperty(property).GetString());

    [Fact]
    public void Eight_single_chip_files_with_FILTER_make_two_bands_of_four_chips()
    {
        // The file names alone (q1_a, q1_b, ...) would give bands a and b: FILTER, primary or extension, wins.
        Assert.Equal(["r", "g"], Strings(data.Quad.GetProperty("bands"), "name"));
        foreach (var (band, suffix, fitsIndex) in new[] { ("r", "a", 0), ("g", "b", 1) })
        {
            var b = data.Band(data.Quad, band);
            var stems = Enumerable.Range(1, 4).Select(k => $"q{k}_{suffix}").ToArray();
            Assert.Equal(stems.Select(s => s + ".fits"), b.GetProperty("files").EnumerateArray().Select(f => f.GetString()));
            Assert.Equal($"q1_{suffix}.fits", b.GetProperty("file").GetString());
            var hdus = b.GetProperty("hdus").EnumerateArray().ToList();
            // Chips of several files: a running index, named by the file stem (g's EXTNAME SCI is in every file).
            Assert.Equal([0, 1, 2, 3], hdus.Select(h => h.GetProperty("index").GetInt32()));
            Assert.Equal(stems, hdus.Select(h => h.GetProperty("name").GetString()));
            Assert.Equal(stems.Select(s => s + ".fits"), hdus.Select(h => h.GetProperty("file").GetString()));
            foreach (var h in hdus)
            {
                // fitsIndex appears where it differs from index: the HDU the chip is in inside its file.
                var index = h.GetProperty("index").GetInt32();
                if (index == fitsIndex) Assert.False(h.TryGetProperty("fitsIndex", out _));
                else Assert.Equal(fitsIndex, h.GetProperty("fitsIndex").GetInt32());
                Assert.Equal("SIP", h.GetProperty("sky").GetProperty("distortion").GetString());
            }
            Assert.Equal(4, b.GetProperty("canvas").GetProperty("chips").GetArrayLength());
        }
        Assert.Empty(data.Quad.GetProperty("problems").EnumerateArray());
        Assert.Equal(JsonValueKind.Null, data.Quad.GetProperty("error").ValueKind);
    }

    [Fact]
    public async Task Files_without_FILTER_are_grouped_by_the_documented_file_name_rule()
    {
        var names = await SkyAssert.Get(data.Client, "/api/fields/names");
        // README rule: names_r → r (folder name and separator off), p1_r and p2-r → r (after the last separator),
        // red → red; zz_x, not FITS, → x.
        Assert.Equal(["r", "red", "x"], Strings(names.GetProperty("bands"), "name"));
        var r = data.Band(names, "r");
        Assert.Equal(["names_r", "p1_r", "p2-r"], Strings(r.GetProperty("hdus"), "name"));
        Assert.Equal(["names_r.fits", "p1_r.fits", "p2-r.fits", "p3_r.fits"], r.GetProperty("files").EnumerateArray().Select(f => f.GetString()));

        // Chip 1 of r is p1_r.fits: its values as astropy.io.fits reads them.
        foreach (var point in data.Written.GetProperty("names").GetProperty("p1_r").EnumerateObject())
        {
            var xy = point.Name.Split(',');
            var probe = await SkyAssert.Get(data.Client, $"/api/fields/names/probe?band=r&hdu=1&x={xy[0]}&y={xy[1]}");
            Assert.Equal("p1_r.fits", probe.GetProperty("file").GetString());
            Assert.Equal("p1_r", probe.GetProperty("hduName").GetString());
            Assert.Equal(point.Value.GetDouble(), probe.GetProperty("value").GetDouble());
        }
        var byName = await SkyAssert.Get(data.Client, "/api/fields/names/probe?band=RED&hdu=PRIMARY&x=9&y=9");
        Assert.Equal(data.Written.GetProperty("names").GetProperty("red").GetProperty("9,9").GetDouble(), byName.GetProperty("value").GetDouble());
        await SkyAssert.Problem(data.Client, "/api/fields/names/probe?band=r&hdu=3&x=1&y=1", HttpStatusCode.NotFound, "hdu");
    }

    [Fact]
    public async Task A_file_that_is_not_FITS_is_listed_as_a_problem_and_the_rest_of_its_band_is_served()
    {
        var names = await SkyAssert.Get(data.Client, "/api/fields/names");
        var problems = names.GetProperty("problems").EnumerateArray().ToList();
        Assert.Equal(["p3_r.fits", "zz_x.fits"], problems.Select(p => p.GetProperty("file").GetString()));
        Assert.All(problems, p => Assert.False(string.IsNullOrWhiteSpace(p.GetProperty("error").GetString())));
        Assert.Equal(JsonValueKind.Null, names.GetProperty("error").ValueKind);
        Assert.Equal(JsonValueKind.Null, data.Band(names, "r").GetProperty("error").ValueKind);

        // A band whose every file fails shows the error and is refused with it.
        var x = data.Band(names, "x");
        Assert.Empty(x.GetProperty("hdus").EnumerateArray());
        Assert.Contains("zz_x.fits", x.GetProperty("error").GetString());
        var refused = await SkyAssert.Problem(data.Client, "/api/fields/names/probe?band=x&x=1&y=1", HttpStatusCode.UnprocessableEntity, "band");
        Assert.Contains("zz_x.fits", refused.GetProperty("detail").GetString());

        // Band-wide statistics are over the readable chips: numpy's count of finite pixels of the three files.
        var stats = await SkyAssert.Get(data.Client, "/api/fields/names/stats?band=r");
        Assert.Equal(data.Written.GetProperty("finite").GetProperty("names_r").GetInt64(), stats.GetProperty("count").GetInt64());
    }

    [Fact]
    public async Task A_multi_extension_file_with_different_FILTERs_splits_into_those_bands()
    {
        var mixed = await SkyAssert.Get(data.Client, "/api/fields/mixed");
        // C1 has no FILTER and the primary none either: the file-name rule, for a file of its own its stem.
        Assert.Equal(["r", "g", "mixed"], Strings(mixed.GetProperty("bands"), "name"));
        var r = data.Band(mixed, "r");
        // A band of one file keeps the FITS HDU index and EXTNAME, so fitsIndex is left out.
        Assert.Equal([1, 3], r.GetProperty("hdus").EnumerateArray().Select(h => h.GetProperty("index").GetInt32()));
        Assert.Equal(["A1", "A2"], Strings(r.GetProperty("hdus"), "name"));
        Assert.All(r.GetProperty("hdus").EnumerateArray(), h => Assert.False(h.TryGetProperty("fitsIndex", out _)));
        Assert.Equal([2], data.Band(mixed, "g").GetProperty("hdus").EnumerateArray().Select(h => h.GetProperty("index").GetInt32()));
        // The bands of one file are told apart in every cache key.
        Assert.Equal(3, mixed.GetProperty("bands").EnumerateArray().Select(b => b.GetProperty("version").GetString()).Distinct().Count());

        var a2 = await SkyAssert.Get(data.Client, "/api/fields/mixed/probe?band=r&hdu=3&x=4&y=5");
        Assert.Equal(data.Written.GetProperty("mixed").GetProperty("A2").GetProperty("4,5").GetDouble(), a2.GetProperty("value").GetDouble());
        Assert.Equal("mixed.fits", a2.GetProperty("file").GetString());
        var c1 = await SkyAssert.Get(data.Client, "/api/fields/mixed/probe?band=mixed&hdu=C1&x=4&y=5");
        Assert.Equal(data.Written.GetProperty("mixed").GetProperty("C1").GetProperty("4,5").GetDouble(), c1.GetProperty("value").GetDouble());
        // HDU 2 is in the file, but in band g.
        await SkyAssert.Problem(data.Client, "/api/fields/mixed/probe?band=r&hdu=2&x=1&y=1", HttpStatusCode.NotFound, "hdu");
    }

    [Fact]
    public async Task A_chip_file_without_WCS_is_left_off_the_canvas_with_the_reason_and_served_on_its_own()
    {
        var patchy = await SkyAssert.Get(data.Client, "/api/fields/patchy");
        var band = Assert.Single(patchy.GetProperty("bands").EnumerateArray());
        Assert.Equal("i", band.GetProperty("name").GetString());
        var hdus = band.GetProperty("hdus").EnumerateArray().ToList();
        Assert.Equal(["p_1", "p_2", "p_3"], hdus.Select(h => h.GetProperty("name").GetString()));
        Assert.Equal(JsonValueKind.Null, hdus[2].GetProperty("sky").ValueKind);
        Assert.Contains("CTYPE", hdus[2].GetProperty("skyError").GetString());

        var canvas = band.GetProperty("canvas");
        Assert.Equal(["p_1", "p_2"], Strings(canvas.GetProperty("chips"), "name"));
        var excluded = Assert.Single(canvas.GetProperty("excluded").EnumerateArray());
        Assert.Equal(2, excluded.GetProperty("hdu").GetInt32());
        Assert.Equal("p_3", excluded.GetProperty("name").GetString());
        Assert.Contains("WCS", excluded.GetProperty("reason").GetString());

        var probe = await SkyAssert.Get(data.Client, "/api/fields/patchy/probe?hdu=p_3&x=10&y=10");
        Assert.Equal("p_3.fits", probe.GetProperty("file").GetString());
        Assert.Equal(JsonValueKind.Null, probe.GetProperty("ra").ValueKind);
    }
}
