namespace Mosaic.TileCache.Tests;

/// <summary>A fresh folder under the system temporary folder, deleted with everything in it.</summary>
internal sealed class TempFolder : IDisposable
{
    public TempFolder()
    {
        Path = System.IO.Path.Combine(System.IO.Path.GetTempPath(), $"mosaic-tilecache-{Guid.NewGuid():N}");
        Directory.CreateDirectory(Path);
    }

    public string Path { get; }

    /// <summary>Bytes of every tile file under the folder, counted from the file system rather than the store.</summary>
    public long TileFileBytes() => Directory.EnumerateFiles(Path, "*.tile", SearchOption.AllDirectories).Sum(f => new FileInfo(f).Length);

    public int TileFileCount() => Directory.EnumerateFiles(Path, "*.tile", SearchOption.AllDirectories).Count();

    public void Dispose()
    {
        try { Directory.Delete(Path, recursive: true); } catch (IOException) { }
    }
}
