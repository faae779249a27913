namespace Mosaic.Imaging.Pyramids;

/// <summary>File names and byte layout of a pyramid folder: one file of 256x256 float32 little-endian tiles per reduced level.</summary>
internal static class PyramidLayout
{
    public const string ManifestFile = "manifest.json";
    public const string HistogramFile = "histogram.bin";
    public const int TilePixels = PyramidGeometry.TileSize * PyramidGeometry.TileSize;
    public const int TileBytes = TilePixels * sizeof(float);

    public static string LevelFile(int z) => $"level-{z:D2}.f32";

    public static long LevelBytes(PyramidGeometry geometry, int z) => (long)geometry.TilesX(z) * geometry.TilesY(z) * TileBytes;

    public static long TileOffset(PyramidGeometry geometry, int z, int x, int y) => ((long)y * geometry.TilesX(z) + x) * TileBytes;

    /// <summary>Level files are raw little-endian floats read straight into spans.</summary>
    public static void EnsureLittleEndian()
    {
        if (!BitConverter.IsLittleEndian)
            throw new PlatformNotSupportedException("pyramid files are little-endian float32; this machine is big-endian");
    }
}
