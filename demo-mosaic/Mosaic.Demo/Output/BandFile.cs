using Mosaic.Fits;
using Mosaic.Fits.Writing;

namespace Mosaic.Demo.Output;

/// <summary>
/// One band's file while it is being written: under a temporary name that never ends in ".fits", renamed into place
/// only when complete, so a reader never sees half a field. Disposing an uncommitted file deletes it.
/// </summary>
internal sealed class BandFile : IDisposable
{
    private const string PartialSuffix = ".partial";

    private readonly FileStream _stream;
    private readonly FitsWriter _writer;
    private bool _committed;
    private bool _disposed;

    private BandFile(string finalPath)
    {
        FinalPath = finalPath;
        TemporaryPath = finalPath + PartialSuffix;
        _stream = new FileStream(TemporaryPath, FileMode.Create, FileAccess.Write, FileShare.None, 1 << 20);
        _writer = new FitsWriter(_stream, leaveOpen: true);
    }

    public string FinalPath { get; }

    public string TemporaryPath { get; }

    public static BandFile Create(string finalPath, IEnumerable<HeaderCard> primaryCards)
    {
        var file = new BandFile(finalPath);
        try
        {
            file._writer.WriteEmptyPrimary(primaryCards);
            return file;
        }
        catch
        {
            file.Dispose();
            throw;
        }
    }

    public void WriteChip(IEnumerable<HeaderCard> cards, int width, int height, ReadOnlySpan<float> pixels) =>
        _writer.WriteFloatImage(cards, width, height, pixels);

    /// <summary>Flushes to disk and moves the file to its final name, replacing an older one.</summary>
    public void Commit()
    {
        _writer.Dispose();
        _stream.Flush(flushToDisk: true);
        _stream.Dispose();
        File.Move(TemporaryPath, FinalPath, overwrite: true);
        _committed = true;
    }

    public void Dispose()
    {
        if (_disposed) return;
        _disposed = true;
        if (_committed) return;
        try
        {
            _writer.Dispose();
        }
        catch (IOException)
        {
            // The file is being abandoned; a failed flush does not matter.
        }
        _stream.Dispose();
        File.Delete(TemporaryPath);
    }
}
