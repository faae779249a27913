using Mosaic.Imaging.Pyramids;

namespace Mosaic.Imaging.Tests.Pyramids;

/// <summary>Built pyramids read back through the tile and region API, against numpy and the FITS data written by astropy.</summary>
public sealed class PyramidReferenceTests(ReferenceImages images) : IClassFixture<ReferenceImages>
{
    private const int T = PyramidGeometry.TileSize;

    public static TheoryData<string> Names => new(ReferenceImages.Names);

    [Theory]
    [MemberData(nameof(Names))]
    public void Geometry_matches_the_reference_script(string name)
    {
        var geometry = images.PyramidOf(name).Geometry;
        var expected = images.Expected(name);
        // Top zoom from the script: the smallest z with 256·2^z ≥ the longer side; each level the ceiling of half the one below.
        Assert.Equal(expected.GetProperty("maxZoom").GetInt32(), geometry.MaxZoom);
        foreach (var level in expected.GetProperty("levels").EnumerateObject())
        {
            var z = int.Parse(level.Name);
            Assert.Equal(level.Value[0].GetInt32(), geometry.LevelWidth(z));
            Assert.Equal(level.Value[1].GetInt32(), geometry.LevelHeight(z));
        }
    }

    [Theory]
    [MemberData(nameof(Names))]
    public void Every_reduced_tile_matches_numpy_nanmean_of_the_level_below(string name)
    {
        var pyramid = images.PyramidOf(name);
        var g = pyramid.Geometry;
        var tile = new float[T * T];
        for (var z = 0; z < g.MaxZoom; z++)
        {
            // numpy (Debian python3-numpy): float64 nanmean over 2x2 blocks of its own level below; 1e-5 relative.
            var expected = images.ExpectedLevel(name, z);
            int width = g.LevelWidth(z), height = g.LevelHeight(z);
            Assert.Equal(width * height, expected.Length);
            for (var ty = 0; ty < g.TilesY(z); ty++)
            for (var tx = 0; tx < g.TilesX(z); tx++)
            {
                pyramid.ReadTile(z, tx, ty, tile);
                for (var r = 0; r < T; r++)
                for (var c = 0; c < T; c++)
                {
                    int i = tx * T + c, j = ty * T + r;
                    var actual = tile[r * T + c];
                    if (i >= width || j >= height)
                    {
                        Assert.True(float.IsNaN(actual), $"{name} z={z} pixel ({i},{j}) lies outside the level and must be NaN, got {actual}");
                        continue;
                    }
                    AssertLevelPixel(expected[j * width + i], actual, $"{name} z={z} pixel ({i},{j})");
                }
            }
        }
    }

    [Theory]
    [MemberData(nameof(Names))]
    public void Native_tiles_are_the_fits_rows_flipped_top_down(string name)
    {
        var pyramid = images.PyramidOf(name);
        var g = pyramid.Geometry;
        // astropy (Debian python3-astropy) wrote the FITS; numpy's data[::-1] is the top-down frame.
        var native = images.NativeTopDown(name);
        var tile = new float[T * T];
        for (var ty = 0; ty < g.TilesY(g.MaxZoom); ty++)
        for (var tx = 0; tx < g.TilesX(g.MaxZoom); tx++)
        {
            pyramid.ReadTile(g.MaxZoom, tx, ty, tile);
            for (var r = 0; r < T; r++)
            for (var c = 0; c < T; c++)
            {
                int i = tx * T + c, j = ty * T + r;
                var actual = tile[r * T + c];
                var expected = i < g.Width && j < g.Height ? native[j * g.Width + i] : float.NaN;
                Assert.True(expected.Equals(actual), $"{name} native pixel ({i},{j}): expected {expected}, got {actual}");
            }
        }
    }

    [Fact]
    public void Zoom_zero_of_a_small_image_is_the_whole_frame_in_one_tile()
    {
        // 200 x 100 fits one tile: zoom 0 is native, top row first, NaN right of column 199 and below row 99.
        var pyramid = images.PyramidOf("small");
        Assert.Equal(0, pyramid.Geometry.MaxZoom);
        Assert.False(pyramid.Geometry.Contains(0, 1, 0));
        var native = images.NativeTopDown("small");
        var tile = new float[T * T];
        pyramid.ReadTile(0, 0, 0, tile);
        Assert.Equal(native[0], tile[0]);
        Assert.Equal(native[99 * 200 + 199], tile[99 * T + 199]);
        Assert.True(float.IsNaN(tile[200]) && float.IsNaN(tile[100 * T]) && float.IsNaN(tile[^1]));
        Assert.Empty(Directory.GetFiles(images.PyramidFolder("small"), "level-*"));
    }

    [Fact]
    public void Zoom_zero_of_a_three_row_strip_averages_across_rows_and_the_lone_last_column()
    {
        // 257 x 3: zoom 0 is 129 x 2; its bottom row has only the bottom native row as children, its last column only column 256.
        var pyramid = images.PyramidOf("strip");
        var expected = images.ExpectedLevel("strip", 0);
        var tile = new float[T * T];
        pyramid.ReadTile(0, 0, 0, tile);
        AssertLevelPixel(expected[128], tile[128], "top right");
        AssertLevelPixel(expected[129 + 128], tile[T + 128], "bottom right");
        AssertLevelPixel(expected[129], tile[T], "bottom left");
        Assert.True(float.IsNaN(tile[129]) && float.IsNaN(tile[2 * T]));
    }

    [Theory]
    [InlineData("wide_odd", 1, -3, 380, 20, 15)]
    [InlineData("wide_odd", 0, 240, -2, 30, 8)]
    [InlineData("tall", 2, 0, 370, 1, 10)]
    [InlineData("even", 0, 250, 250, 12, 12)]
    [InlineData("even", 1, 505, -4, 12, 12)]
    [InlineData("strip", 1, 100, 0, 200, 4)]
    public void Region_reads_match_numpy_and_are_nan_outside(string name, int z, int left, int top, int width, int height)
    {
        var pyramid = images.PyramidOf(name);
        var g = pyramid.Geometry;
        var region = new float[width * height];
        pyramid.ReadRegion(z, left, top, width, height, region);
        // The native level is the astropy-written frame itself, top row first.
        var expected = z == g.MaxZoom ? Array.ConvertAll(images.NativeTopDown(name), v => (double)v) : images.ExpectedLevel(name, z);
        int levelWidth = g.LevelWidth(z), levelHeight = g.LevelHeight(z);
        for (var j = 0; j < height; j++)
        for (var i = 0; i < width; i++)
        {
            int x = left + i, y = top + j;
            var actual = region[j * width + i];
            if (x < 0 || y < 0 || x >= levelWidth || y >= levelHeight) Assert.True(float.IsNaN(actual), $"({x},{y}) lies outside");
            else AssertLevelPixel(expected[y * levelWidth + x], actual, $"{name} z={z} ({x},{y})");
        }
        // numpy (Debian python3-numpy) for one pixel through the single-pixel read too.
        var (px, py) = (Math.Max(left, 0), Math.Max(top, 0));
        AssertLevelPixel(expected[py * levelWidth + px], pyramid.ReadLevelPixel(z, px, py), "single pixel");
    }

    [Theory]
    [MemberData(nameof(Names))]
    public void Native_statistics_match_numpy(string name)
    {
        var statistics = images.PyramidOf(name).Statistics;
        var expected = images.Expected(name);
        // numpy (Debian python3-numpy): finite and NaN counts, extremes, and nanpercentile within one histogram bin.
        Assert.Equal(expected.GetProperty("finite").GetInt64(), statistics.Count);
        Assert.Equal(expected.GetProperty("masked").GetInt64(), statistics.Masked);
        Assert.Equal(expected.GetProperty("min").GetDouble(), statistics.Min);
        Assert.Equal(expected.GetProperty("max").GetDouble(), statistics.Max);
        foreach (var q in expected.GetProperty("quantiles").EnumerateArray())
        {
            var value = q.GetProperty("value").GetDouble();
            var tolerance = q.GetProperty("tolerance").GetDouble();
            var actual = statistics.Percentile(q.GetProperty("p").GetDouble());
            Assert.True(Math.Abs(actual - value) <= tolerance, $"{name} percentile {q.GetProperty("p")}: expected {value} ± {tolerance}, got {actual}");
        }
    }

    [Fact]
    public void Progress_rises_from_zero_to_one_in_steps_of_at_most_one_percent()
    {
        var values = images.Progress["wide_odd"];
        Assert.Equal(0, values[0]);
        Assert.Equal(1, values[^1]);
        for (var i = 1; i < values.Count; i++)
        {
            Assert.True(values[i] >= values[i - 1], $"progress fell from {values[i - 1]} to {values[i]}");
            Assert.True(values[i] - values[i - 1] <= 0.01, $"progress jumped from {values[i - 1]} to {values[i]}");
        }
    }

    [Theory]
    [InlineData(-1, 0, 0)]
    [InlineData(3, 0, 0)]
    [InlineData(1, 2, 0)]
    [InlineData(1, 0, 2)]
    [InlineData(0, -1, 0)]
    [InlineData(2, 4, 0)]
    public void Tiles_outside_the_grid_are_out_of_range(int z, int x, int y)
    {
        // 1000 x 777: zoom 1 is 500 x 389 pixels, 2 x 2 tiles; zoom 2 (native) 4 x 4 tiles.
        var tile = new float[T * T];
        Assert.Throws<ArgumentOutOfRangeException>(() => images.PyramidOf("wide_odd").ReadTile(z, x, y, tile));
    }

    [Fact]
    public void A_destination_smaller_than_a_tile_is_rejected()
    {
        Assert.Throws<ArgumentException>(() => images.PyramidOf("wide_odd").ReadTile(0, 0, 0, new float[T * T - 1]));
    }

    private static void AssertLevelPixel(double expected, float actual, string where)
    {
        if (double.IsNaN(expected))
        {
            Assert.True(float.IsNaN(actual), $"{where}: every child is masked, expected NaN, got {actual}");
            return;
        }
        Assert.True(Math.Abs(actual - expected) <= 1e-5 * Math.Abs(expected), $"{where}: expected {expected}, got {actual}");
    }
}
