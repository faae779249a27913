using System.Runtime.InteropServices;
using Microsoft.Win32.SafeHandles;
using Mosaic.Fits;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Pyramids;

/// <summary>
/// A built pyramid: reduced levels from the cache folder, one positional read per tile; the native level from its
/// own level file where the build stored it, else from the source plane. Level coordinates are 0-based and
/// top-anchored (row 0 is the top of the image). Thread-safe.
/// </summary>
public sealed class Pyramid : IDisposable
{
    private const int T = PyramidGeometry.TileSize;

    /// <summary>Null where the native level is stored: then _levels holds it too, at index MaxZoom.</summary>
    private readonly ImagePlane? _native;
    private readonly SafeFileHandle[] _levels;
    private volatile bool _disposed;

    private Pyramid(PyramidGeometry geometry, ValueHistogram histogram, ImagePlane? native, SafeFileHandle[] levels)
    {
        Geometry = geometry;
        Histogram = histogram;
        Statistics = BandStatistics.From(histogram);
        _native = native;
        _levels = levels;
    }

    public PyramidGeometry Geometry { get; }

    /// <summary>Histogram of the native pixels.</summary>
    public ValueHistogram Histogram { get; }

    /// <summary>Field-wide statistics of the native pixels, from <see cref="Histogram"/>.</summary>
    public BandStatistics Statistics { get; }

    /// <summary>True where native tiles and regions come from the cache folder, not the source plane (<see cref="PyramidBuildOptions.StoreNative"/>).</summary>
    public bool StoresNative => _native is null;

    /// <summary>Opens a pyramid built by <see cref="PyramidBuilder"/>; InvalidDataException where the folder holds no complete build for this plane.</summary>
    public static Pyramid Open(string directory, ImagePlane native)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(directory);
        ArgumentNullException.ThrowIfNull(native);
        PyramidLayout.EnsureLittleEndian();
        var manifest = PyramidManifest.Read(Path.Combine(directory, PyramidLayout.ManifestFile));
        if (manifest.Width != native.Width || manifest.Height != native.Height)
            throw new InvalidDataException($"pyramid in {directory} is for a {manifest.Width}x{manifest.Height} image; the plane is {native.Width}x{native.Height}");
        if (manifest.SourceBitPix != native.BitPix)
            throw new InvalidDataException($"pyramid in {directory} was built from BITPIX {manifest.SourceBitPix}; the plane has BITPIX {native.BitPix}");
        return Open(directory, manifest, manifest.NativeStored ? null : native);
    }

    /// <summary>
    /// Opens a pyramid built with <see cref="PyramidBuildOptions.StoreNative"/> without its source, which may be gone;
    /// InvalidDataException where the folder holds no complete build or the build did not store the native level.
    /// </summary>
    public static Pyramid Open(string directory)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(directory);
        PyramidLayout.EnsureLittleEndian();
        var manifest = PyramidManifest.Read(Path.Combine(directory, PyramidLayout.ManifestFile));
        if (!manifest.NativeStored)
            throw new InvalidDataException($"pyramid in {directory} reads its native level from the source image; open it with that image");
        return Open(directory, manifest, native: null);
    }

    private static Pyramid Open(string directory, PyramidManifest manifest, ImagePlane? native)
    {
        if (manifest.Width <= 0 || manifest.Height <= 0)
            throw new InvalidDataException($"pyramid in {directory} claims a {manifest.Width}x{manifest.Height} image");
        var geometry = new PyramidGeometry(manifest.Width, manifest.Height);
        if (manifest.MaxZoom != geometry.MaxZoom)
            throw new InvalidDataException($"pyramid in {directory} has zoom levels 0..{manifest.MaxZoom}; a {manifest.Width}x{manifest.Height} image needs 0..{geometry.MaxZoom}");

        var histogram = LoadHistogram(Path.Combine(directory, PyramidLayout.HistogramFile));
        if (histogram.FiniteCount + histogram.MaskedCount != (long)geometry.Width * geometry.Height)
            throw new InvalidDataException($"pyramid histogram in {directory} counts {histogram.FiniteCount + histogram.MaskedCount} pixels; the image has {(long)geometry.Width * geometry.Height}");

        var levels = new SafeFileHandle[native is null ? geometry.MaxZoom + 1 : geometry.MaxZoom];
        try
        {
            for (var z = 0; z < levels.Length; z++) levels[z] = OpenLevel(directory, geometry, z);
        }
        catch
        {
            foreach (var level in levels) level?.Dispose();
            throw;
        }
        return new Pyramid(geometry, histogram, native, levels);
    }

    /// <summary>One 256x256 tile of float values (the first 65,536 of destination), row 0 at the top; NaN for masked pixels and outside the image.</summary>
    public void ReadTile(int z, int x, int y, Span<float> destination)
    {
        ObjectDisposedException.ThrowIf(_disposed, this);
        if (!Geometry.Contains(z, x, y))
            throw new ArgumentOutOfRangeException(nameof(z), $"tile {z}/{x}/{y} lies outside the grid (zoom 0..{Geometry.MaxZoom})");
        if (destination.Length < PyramidLayout.TilePixels)
            throw new ArgumentException($"a tile needs {PyramidLayout.TilePixels} floats; destination holds {destination.Length}", nameof(destination));
        var tile = destination[..PyramidLayout.TilePixels];
        if (z == Geometry.MaxZoom && _native is not null) ReadNative(_native, x * T, y * T, T, T, tile);
        else ReadExactly(_levels[z], MemoryMarshal.AsBytes(tile), PyramidLayout.TileOffset(Geometry, z, x, y));
    }

    /// <summary>
    /// Level-z pixels [left, left + width) x [top, top + height) (top-anchored) into destination, row-major with
    /// the top row first; NaN outside the level. One positional read per row and tile crossed.
    /// </summary>
    public void ReadRegion(int z, int left, int top, int width, int height, Span<float> destination)
    {
        ObjectDisposedException.ThrowIf(_disposed, this);
        if (z < 0 || z > Geometry.MaxZoom) throw new ArgumentOutOfRangeException(nameof(z), z, $"zoom runs from 0 to {Geometry.MaxZoom}");
        if (width < 0 || height < 0) throw new ArgumentOutOfRangeException(nameof(width), "a region cannot have a negative size");
        if (destination.Length < (long)width * height)
            throw new ArgumentException($"a {width}x{height} region needs {(long)width * height} floats; destination holds {destination.Length}", nameof(destination));
        var region = destination[..(width * height)];
        if (z == Geometry.MaxZoom && _native is not null)
        {
            ReadNative(_native, left, top, width, height, region);
            return;
        }
        int levelWidth = Geometry.LevelWidth(z), levelHeight = Geometry.LevelHeight(z);
        int c0 = Math.Clamp(left, 0, levelWidth), c1 = (int)Math.Clamp((long)left + width, 0, levelWidth);
        for (var j = 0; j < height; j++)
        {
            var row = region.Slice(j * width, width);
            var r = (long)top + j;
            if (r < 0 || r >= levelHeight || c0 >= c1)
            {
                row.Fill(float.NaN);
                continue;
            }
            row[..(c0 - left)].Fill(float.NaN);
            row[(c1 - left)..].Fill(float.NaN);
            var ty = (int)r / T;
            for (var c = c0; c < c1;)
            {
                var tx = c / T;
                var end = Math.Min(c1, (tx + 1) * T);
                var offset = PyramidLayout.TileOffset(Geometry, z, tx, ty) + ((long)((int)r % T) * T + (c - tx * T)) * sizeof(float);
                ReadExactly(_levels[z], MemoryMarshal.AsBytes(row[(c - left)..(end - left)]), offset);
                c = end;
            }
        }
    }

    /// <summary>One level-z pixel (column i, row j from the top); NaN outside the level or masked.</summary>
    public float ReadLevelPixel(int z, int i, int j)
    {
        Span<float> value = stackalloc float[1];
        ReadRegion(z, i, j, 1, 1, value);
        return value[0];
    }

    public void Dispose()
    {
        _disposed = true;
        foreach (var level in _levels) level.Dispose();
    }

    /// <summary>
    /// Native rows come from the plane bottom-up; the region is top-down. Where the region's columns lie inside the
    /// image (every tile but those on the right edge), its rows inside come in one block read.
    /// </summary>
    private void ReadNative(ImagePlane native, int left, int top, int width, int height, Span<float> region)
    {
        int imageWidth = Geometry.Width, imageHeight = Geometry.Height;
        int c0 = Math.Clamp(left, 0, imageWidth), c1 = (int)Math.Clamp((long)left + width, 0, imageWidth);
        if (c0 == left && c1 - c0 == width && width > 0)
        {
            // Region rows [first, end) lie inside the image.
            int first = (int)Math.Clamp(-(long)top, 0, height), end = (int)Math.Clamp((long)imageHeight - top, 0, height);
            if (first >= end)
            {
                region.Fill(float.NaN);
                return;
            }
            region[..(first * width)].Fill(float.NaN);
            region[(end * width)..].Fill(float.NaN);
            native.ReadBlock(left, imageHeight - 1 - (top + first), width, end - first, -1, region[(first * width)..(end * width)]);
            return;
        }
        for (var j = 0; j < height; j++)
        {
            var row = region.Slice(j * width, width);
            var r = (long)top + j;
            if (r < 0 || r >= imageHeight || c0 >= c1)
            {
                row.Fill(float.NaN);
                continue;
            }
            row[..(c0 - left)].Fill(float.NaN);
            row[(c1 - left)..].Fill(float.NaN);
            native.ReadRow(imageHeight - 1 - (int)r, c0, row[(c0 - left)..(c1 - left)]);
        }
    }

    private static ValueHistogram LoadHistogram(string path)
    {
        try
        {
            using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read | FileShare.Delete);
            return ValueHistogram.Load(stream);
        }
        catch (Exception e) when (e is FileNotFoundException or DirectoryNotFoundException)
        {
            throw new InvalidDataException($"no complete pyramid: {path} is missing", e);
        }
    }

    private static SafeFileHandle OpenLevel(string directory, PyramidGeometry geometry, int z)
    {
        var path = Path.Combine(directory, PyramidLayout.LevelFile(z));
        SafeFileHandle handle;
        try
        {
            handle = File.OpenHandle(path, FileMode.Open, FileAccess.Read, FileShare.Read | FileShare.Delete);
        }
        catch (Exception e) when (e is FileNotFoundException or DirectoryNotFoundException)
        {
            throw new InvalidDataException($"no complete pyramid: level file {path} is missing", e);
        }
        var expected = PyramidLayout.LevelBytes(geometry, z);
        var length = RandomAccess.GetLength(handle);
        if (length != expected)
        {
            handle.Dispose();
            throw new InvalidDataException($"level file {path} holds {length} bytes; zoom {z} needs {expected}");
        }
        return handle;
    }

    private static void ReadExactly(SafeFileHandle file, Span<byte> destination, long offset)
    {
        while (!destination.IsEmpty)
        {
            var read = RandomAccess.Read(file, destination, offset);
            if (read == 0) throw new InvalidDataException("level file ended early: the pyramid was truncated after it was built");
            destination = destination[read..];
            offset += read;
        }
    }
}
