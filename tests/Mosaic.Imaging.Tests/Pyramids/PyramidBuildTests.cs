using System.Text.Json.Nodes;
using Mosaic.Fits;
using Mosaic.Imaging.Pyramids;

namespace Mosaic.Imaging.Tests.Pyramids;

/// <summary>The build is all or nothing: a cancelled or failed build leaves no folder, and Open refuses anything but a complete build for the same plane.</summary>
public sealed class PyramidBuildTests(ReferenceImages images) : IClassFixture<ReferenceImages>, IDisposable
{
    private readonly string _parent = Directory.CreateTempSubdirectory("mosaic-build-").FullName;

    [Fact]
    public void A_cancelled_build_leaves_no_folder_behind()
    {
        using var cancel = new CancellationTokenSource();
        var target = Path.Combine(_parent, "cancelled");
        Assert.ThrowsAny<OperationCanceledException>(() =>
            PyramidBuilder.Build(images.Plane("wide_odd"), target, new ProgressLog(cancel, 0.3), cancel.Token));
        Assert.Empty(Directory.EnumerateFileSystemEntries(_parent));
        Assert.Throws<InvalidDataException>(() => Pyramid.Open(target, images.Plane("wide_odd")));
    }

    [Fact]
    public void A_build_whose_source_fails_mid_read_leaves_no_folder_behind()
    {
        var copy = Path.Combine(_parent, "frame.fits");
        File.Copy(images.FitsPath("wide_odd"), copy);
        using var fits = FitsFile.Open(copy);
        var plane = (RawImagePlane)fits.Hdus[0].Image!;
        // Cut the data in half under the open file: the reader's positional reads run past its end.
        using (var stream = new FileStream(copy, FileMode.Open, FileAccess.Write, FileShare.ReadWrite))
            stream.SetLength(plane.DataOffset + (long)plane.Width * plane.Height * 2);
        var target = Path.Combine(_parent, "failed");
        Assert.ThrowsAny<Exception>(() => PyramidBuilder.Build(plane, target, null, CancellationToken.None));
        Assert.Equal([copy], Directory.EnumerateFileSystemEntries(_parent));
    }

    [Fact]
    public void Open_of_a_missing_folder_is_invalid_data()
    {
        Assert.Throws<InvalidDataException>(() => Pyramid.Open(Path.Combine(_parent, "never-built"), images.Plane("even")));
    }

    [Theory]
    [InlineData("manifest.json")]
    [InlineData("histogram.bin")]
    [InlineData("level-00.f32")]
    public void Open_of_a_folder_missing_a_part_is_invalid_data(string part)
    {
        var folder = CopyOfBuild("wide_odd");
        File.Delete(Path.Combine(folder, part));
        Assert.Throws<InvalidDataException>(() => Pyramid.Open(folder, images.Plane("wide_odd")));
    }

    [Fact]
    public void Open_of_a_truncated_level_file_is_invalid_data()
    {
        var folder = CopyOfBuild("wide_odd");
        using (var stream = new FileStream(Path.Combine(folder, "level-01.f32"), FileMode.Open))
            stream.SetLength(stream.Length - 4);
        Assert.Throws<InvalidDataException>(() => Pyramid.Open(folder, images.Plane("wide_odd")));
    }

    [Theory]
    [InlineData("formatVersion", 2)]
    [InlineData("width", 999)]
    [InlineData("tileSize", 512)]
    public void Open_refuses_a_manifest_of_another_version_or_geometry(string field, int value)
    {
        var folder = CopyOfBuild("wide_odd");
        var manifestPath = Path.Combine(folder, "manifest.json");
        var manifest = JsonNode.Parse(File.ReadAllText(manifestPath))!.AsObject();
        manifest[field] = value;
        File.WriteAllText(manifestPath, manifest.ToJsonString());
        Assert.Throws<InvalidDataException>(() => Pyramid.Open(folder, images.Plane("wide_odd")));
    }

    [Fact]
    public void Open_refuses_a_corrupt_manifest()
    {
        var folder = CopyOfBuild("even");
        File.WriteAllText(Path.Combine(folder, "manifest.json"), "{ \"format\": \"mosaic-pyramid\", ");
        Assert.Throws<InvalidDataException>(() => Pyramid.Open(folder, images.Plane("even")));
    }

    [Fact]
    public void Open_refuses_the_build_of_another_plane()
    {
        Assert.Throws<InvalidDataException>(() => Pyramid.Open(images.PyramidFolder("wide_odd"), images.Plane("tall")));
    }

    [Fact]
    public void Building_over_an_existing_folder_replaces_it_and_leaves_no_siblings()
    {
        var target = Path.Combine(_parent, "shared-name");
        PyramidBuilder.Build(images.Plane("tall"), target, null, CancellationToken.None);
        PyramidBuilder.Build(images.Plane("strip"), target, null, CancellationToken.None);
        Assert.Throws<InvalidDataException>(() => Pyramid.Open(target, images.Plane("tall")));
        using var pyramid = Pyramid.Open(target, images.Plane("strip"));
        Assert.Equal(257, pyramid.Geometry.Width);
        Assert.Equal([target], Directory.EnumerateFileSystemEntries(_parent));
    }

    [Fact]
    public void Reads_after_dispose_are_refused()
    {
        var pyramid = Pyramid.Open(images.PyramidFolder("even"), images.Plane("even"));
        pyramid.Dispose();
        Assert.Throws<ObjectDisposedException>(() => pyramid.ReadTile(0, 0, 0, new float[PyramidGeometry.TileSize * PyramidGeometry.TileSize]));
    }

    public void Dispose() => Directory.Delete(_parent, recursive: true);

    private string CopyOfBuild(string name)
    {
        var folder = Path.Combine(_parent, name + "-copy-" + Guid.NewGuid().ToString("N")[..6]);
        Directory.CreateDirectory(folder);
        foreach (var file in Directory.GetFiles(images.PyramidFolder(name)))
            File.Copy(file, Path.Combine(folder, Path.GetFileName(file)));
        return folder;
    }
}
