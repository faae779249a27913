using Microsoft.Win32.SafeHandles;
using Mosaic.Fits.Parsing;

namespace Mosaic.Fits;

/// <summary>An open FITS file: every header parsed once at open, pixel data read on demand through <see cref="ImagePlane"/>.</summary>
public sealed class FitsFile : IDisposable
{
    private FitsFile(string path, SafeFileHandle handle, long length, IReadOnlyList<Hdu> hdus)
    {
        Path = path; Handle = handle; Length = length; Hdus = hdus;
    }

    public string Path { get; }
    internal SafeFileHandle Handle { get; }
    public long Length { get; }
    public IReadOnlyList<Hdu> Hdus { get; }

    /// <summary>Opens and parses every header. Throws <see cref="FitsFormatException"/> for a malformed file.</summary>
    public static FitsFile Open(string path)
    {
        ArgumentException.ThrowIfNullOrEmpty(path);
        // ReadWrite | Delete sharing: the file may be replaced or removed while served; reads then fail cleanly.
        var handle = File.OpenHandle(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite | FileShare.Delete);
        try
        {
            var length = RandomAccess.GetLength(handle);
            var hdus = FileScanner.Scan(handle, path, length);
            return new FitsFile(path, handle, length, hdus);
        }
        catch
        {
            handle.Dispose();
            throw;
        }
    }

    public void Dispose() => Handle.Dispose();
}
