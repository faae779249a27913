using Microsoft.Win32.SafeHandles;

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
    public static FitsFile Open(string path) => throw new NotImplementedException();

    public void Dispose() => Handle.Dispose();
}
