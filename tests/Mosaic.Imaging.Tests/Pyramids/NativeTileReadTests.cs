using Mosaic.Fits;
using Mosaic.Imaging.Pyramids;
using Mosaic.Imaging.Tests.Statistics;

namespace Mosaic.Imaging.Tests.Pyramids;

/// <summary>
/// Native tiles read from the source plane (the level the pyramid does not store), for every kind of stored sample:
/// against numpy's physical values of the astropy-written files, and against a plain row-by-row read of the same plane.
/// The frames are 300 x 520, so the grid has edge tiles on the right (partial columns) and at the bottom (partial rows).
/// </summary>
public sealed class NativeTileReadTests : IClassFixture<NativeReadFrames>
{
    private const int T = PyramidGeometry.TileSize;

    private readonly NativeReadFrames _frames;

    public NativeTileReadTests(NativeReadFrames frames) => _frames = frames;

    public static TheoryData<string> Names => new(NativeReadFrames.Names);

    [Theory]
    [MemberData(nameof(Names))]
    public void Every_native_tile_matches_numpy_and_a_row_by_row_read(string name)
    {
        var pyramid = _frames.PyramidOf(name);
        var plane = _frames.Plane(name);
        var g = pyramid.Geometry;
        Assert.False(pyramid.StoresNative);
        Assert.Equal((300, 520, 2, 3), (g.Width, g.Height, g.TilesX(g.MaxZoom), g.TilesY(g.MaxZoom)));
        // numpy (Debian python3-numpy) on the stored values astropy (Debian python3-astropy) wrote: BZERO + BSCALE x
        // stored in float64, NaN where the stored value is BLANK (FITS 4.0 sections 4.4.2.5 and 5.3), rounded once
        // to float32, top row first.
        var expected = _frames.NativeTopDown(name);
        var tile = new float[T * T];
        var row = new float[g.Width];
        var masked = 0;
        for (var ty = 0; ty < g.TilesY(g.MaxZoom); ty++)
        for (var tx = 0; tx < g.TilesX(g.MaxZoom); tx++)
        {
            pyramid.ReadTile(g.MaxZoom, tx, ty, tile);
            for (var r = 0; r < T; r++)
            {
                var j = ty * T + r;
                if (j < g.Height) plane.ReadRow(g.Height - 1 - j, 0, row);
                for (var c = 0; c < T; c++)
                {
                    var i = tx * T + c;
                    var actual = tile[r * T + c];
                    var where = $"{name} tile {tx},{ty} pixel ({i},{j})";
                    if (i >= g.Width || j >= g.Height)
                    {
                        Assert.True(float.IsNaN(actual), $"{where} lies outside the image and must be NaN, got {actual}");
                        continue;
                    }
                    Assert.True(row[i].Equals(actual), $"{where}: row read {row[i]:R}, tile {actual:R}");
                    AssertWithinOneUlp(expected[j * g.Width + i], actual, where);
                    if (float.IsNaN(actual)) masked++;
                }
            }
        }
        Assert.Equal(_frames.MaskedCount(name), masked);
    }

    [Theory]
    [InlineData("i16", -3, -5, 40, 12)]
    [InlineData("u8", 280, 500, 30, 30)]
    [InlineData("f64", 0, 250, 300, 11)]
    [InlineData("f32s", 17, 0, 256, 256)]
    [InlineData("i32", 299, 519, 1, 1)]
    [InlineData("u16", 100, -1, 50, 523)]
    public void Native_regions_match_numpy_and_are_nan_outside(string name, int left, int top, int width, int height)
    {
        var pyramid = _frames.PyramidOf(name);
        var g = pyramid.Geometry;
        var region = new float[width * height];
        pyramid.ReadRegion(g.MaxZoom, left, top, width, height, region);
        // numpy (Debian python3-numpy), as above.
        var expected = _frames.NativeTopDown(name);
        for (var j = 0; j < height; j++)
        for (var i = 0; i < width; i++)
        {
            int x = left + i, y = top + j;
            var actual = region[j * width + i];
            if (x < 0 || y < 0 || x >= g.Width || y >= g.Height) Assert.True(float.IsNaN(actual), $"({x},{y}) lies outside");
            else AssertWithinOneUlp(expected[y * g.Width + x], actual, $"{name} ({x},{y})");
        }
    }

    /// <summary>
    /// Integer data scaled in double agree exactly; BITPIX -32 with BSCALE may round once more in numpy's float32
    /// view of the stored float, so one unit in the last place is the bound.
    /// </summary>
    private static void AssertWithinOneUlp(float expected, float actual, string where)
    {
        if (float.IsNaN(expected))
        {
            Assert.True(float.IsNaN(actual), $"{where}: numpy NaN (masked), got {actual:R}");
            return;
        }
        Assert.False(float.IsNaN(actual), $"{where}: numpy {expected:R}, got NaN");
        var ulps = Math.Abs((long)BitConverter.SingleToInt32Bits(expected) - BitConverter.SingleToInt32Bits(actual));
        Assert.True(ulps <= 1, $"{where}: numpy {expected:R}, got {actual:R}");
    }
}
