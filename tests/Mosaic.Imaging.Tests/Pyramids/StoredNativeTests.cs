using System.Text.Json.Nodes;
using Mosaic.Fits;
using Mosaic.Imaging.Pyramids;

namespace Mosaic.Imaging.Tests.Pyramids;

/// <summary>
/// A pyramid built with StoreNative keeps its native level in the cache folder: its native tiles and regions are
/// the frame numpy (Debian python3-numpy) read from the astropy-written FITS, bit for bit, and it opens without its
/// source. Folders written before the option existed still open and read their native pixels from the plane.
/// </summary>
public sealed class StoredNativeTests(ReferenceImages images) : IClassFixture<ReferenceImages>, IDisposable
{
    private const int T = PyramidGeometry.TileSize;
    private static readonly PyramidBuildOptions StoreNative = new() { StoreNative = true };

    private readonly string _parent = Directory.CreateTempSubdirectory("mosaic-native-").FullName;

    public static TheoryData<string> Names() => [.. ReferenceImages.Names];

    [Theory]
    [MemberData(nameof(Names))]
    public void Stored_native_tiles_are_the_numpy_frame_bit_for_bit(string name)
    {
        var folder = BuildStored(name);
        using var pyramid = Pyramid.Open(folder, images.Plane(name));
        Assert.True(pyramid.StoresNative);
        var g = pyramid.Geometry;
        // The native level is a level file of its own, whole tiles of float32: the layout of the reduced levels.
        Assert.Equal((long)g.TilesX(g.MaxZoom) * g.TilesY(g.MaxZoom) * T * T * sizeof(float),
            new FileInfo(Path.Combine(folder, $"level-{g.MaxZoom:D2}.f32")).Length);
        AssertNativeTiles(name, pyramid);
    }

    [Theory]
    [InlineData("wide_odd", -3, 380, 300, 20)]
    [InlineData("wide_odd", 990, 770, 20, 12)]
    [InlineData("tall", -1, 250, 5, 300)]
    [InlineData("even", 250, 250, 12, 12)]
    [InlineData("strip", 100, -2, 200, 6)]
    [InlineData("small", 190, 95, 20, 10)]
    public void Stored_native_regions_are_the_numpy_frame_and_nan_outside(string name, int left, int top, int width, int height)
    {
        using var pyramid = Pyramid.Open(BuildStored(name), images.Plane(name));
        var g = pyramid.Geometry;
        var region = new float[width * height];
        pyramid.ReadRegion(g.MaxZoom, left, top, width, height, region);
        // numpy (Debian python3-numpy): data[::-1] of the astropy-written frame, top row first.
        var native = images.NativeTopDown(name);
        for (var j = 0; j < height; j++)
        for (var i = 0; i < width; i++)
        {
            int x = left + i, y = top + j;
            var expected = x >= 0 && y >= 0 && x < g.Width && y < g.Height ? native[y * g.Width + x] : float.NaN;
            var actual = region[j * width + i];
            Assert.True(expected.Equals(actual), $"{name} native ({x},{y}): expected {expected}, got {actual}");
        }
    }

    [Fact]
    public void Stored_native_reads_equal_the_plane_read_directly_and_the_reduced_levels_are_unchanged()
    {
        // In-project reference: the FITS plane's own rows, flipped top-down (the frame itself, checked against numpy above).
        const string name = "wide_odd";
        var plane = images.Plane(name);
        using var stored = Pyramid.Open(BuildStored(name), plane);
        var fromPlane = images.PyramidOf(name);
        Assert.False(fromPlane.StoresNative);
        var g = stored.Geometry;
        var row = new float[g.Width];
        var region = new float[g.Width];
        for (var r = 0; r < g.Height; r++)
        {
            plane.ReadRow(g.Height - 1 - r, 0, row);
            stored.ReadRegion(g.MaxZoom, 0, r, g.Width, 1, region);
            Assert.True(row.AsSpan().SequenceEqual(region), $"native row {r} from the top differs from the plane's");
        }
        // Storing the native level adds a file; the reduced levels are the same bytes.
        for (var z = 0; z < g.MaxZoom; z++)
            Assert.Equal(File.ReadAllBytes(Path.Combine(images.PyramidFolder(name), $"level-{z:D2}.f32")),
                File.ReadAllBytes(Path.Combine(Path.Combine(_parent, name), $"level-{z:D2}.f32")));
    }

    [Fact]
    public void A_stored_native_pyramid_reopens_after_its_source_file_is_deleted()
    {
        const string name = "wide_odd";
        var copy = Path.Combine(_parent, "source.fits");
        File.Copy(images.FitsPath(name), copy);
        var folder = Path.Combine(_parent, "from-copy");
        using (var fits = FitsFile.Open(copy))
            PyramidBuilder.Build(fits.Hdus[0].Image!, folder, StoreNative, null, CancellationToken.None);
        File.Delete(copy);
        using var pyramid = Pyramid.Open(folder);
        Assert.True(pyramid.StoresNative);
        Assert.Equal((1000, 777), (pyramid.Geometry.Width, pyramid.Geometry.Height));
        AssertNativeTiles(name, pyramid);
    }

    [Fact]
    public void Opening_without_a_plane_is_refused_for_a_pyramid_that_reads_the_plane()
    {
        Assert.Throws<InvalidDataException>(() => Pyramid.Open(images.PyramidFolder("even")));
    }

    [Fact]
    public void A_folder_written_before_the_option_still_opens_and_reads_the_plane()
    {
        // The manifest of such a folder has no "nativeStored" field and no native level file.
        var folder = CopyOf(images.PyramidFolder("wide_odd"), "old-format");
        var manifestPath = Path.Combine(folder, "manifest.json");
        var manifest = JsonNode.Parse(File.ReadAllText(manifestPath))!.AsObject();
        Assert.True(manifest.Remove("nativeStored"));
        File.WriteAllText(manifestPath, manifest.ToJsonString());
        using var pyramid = Pyramid.Open(folder, images.Plane("wide_odd"));
        Assert.False(pyramid.StoresNative);
        AssertNativeTiles("wide_odd", pyramid);
    }

    [Fact]
    public void A_stored_native_level_file_that_is_missing_or_truncated_is_invalid_data()
    {
        var built = BuildStored("wide_odd");
        var file = $"level-{images.PyramidOf("wide_odd").Geometry.MaxZoom:D2}.f32";
        var missing = CopyOf(built, "missing");
        File.Delete(Path.Combine(missing, file));
        Assert.Throws<InvalidDataException>(() => Pyramid.Open(missing, images.Plane("wide_odd")));
        var truncated = CopyOf(built, "truncated");
        using (var stream = new FileStream(Path.Combine(truncated, file), FileMode.Open))
            stream.SetLength(stream.Length - 4);
        Assert.Throws<InvalidDataException>(() => Pyramid.Open(truncated, images.Plane("wide_odd")));
        Assert.Throws<InvalidDataException>(() => Pyramid.Open(truncated));
    }

    [Fact]
    public void A_stored_native_pyramid_still_refuses_another_plane()
    {
        Assert.Throws<InvalidDataException>(() => Pyramid.Open(BuildStored("wide_odd"), images.Plane("tall")));
    }

    public void Dispose() => Directory.Delete(_parent, recursive: true);

    private string BuildStored(string name)
    {
        var folder = Path.Combine(_parent, name);
        if (!Directory.Exists(folder)) PyramidBuilder.Build(images.Plane(name), folder, StoreNative, null, CancellationToken.None);
        return folder;
    }

    private string CopyOf(string source, string label)
    {
        var folder = Path.Combine(_parent, label);
        Directory.CreateDirectory(folder);
        foreach (var file in Directory.GetFiles(source)) File.Copy(file, Path.Combine(folder, Path.GetFileName(file)));
        return folder;
    }

    private void AssertNativeTiles(string name, Pyramid pyramid)
    {
        var g = pyramid.Geometry;
        // numpy (Debian python3-numpy): data[::-1] of the astropy-written frame; NaN past the image in edge tiles.
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
                var expected = i < g.Width && j < g.Height ? native[j * g.Width + i] : float.NaN;
                var actual = tile[r * T + c];
                Assert.True(expected.Equals(actual), $"{name} native pixel ({i},{j}): expected {expected}, got {actual}");
            }
        }
    }
}
