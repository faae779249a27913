using Mosaic.Fits;

namespace Mosaic.Fuzz;

/// <summary>Opens the input as a FITS file (every header, every tile index) and reads a row and a value of each image.</summary>
public static class FileTarget
{
    // Memory-backed where available: the reader takes a path, and each execution rewrites this one file.
    private static readonly string ScratchPath = Path.Combine(
        Directory.Exists("/dev/shm") ? "/dev/shm" : Path.GetTempPath(), $"mosaic-fuzz-{Environment.ProcessId}.fits");

    public static void Run(Stream input)
    {
        using (var file = File.Create(ScratchPath)) input.CopyTo(file);
        try
        {
            using var fits = FitsFile.Open(ScratchPath);
            foreach (var hdu in fits.Hdus)
            {
                if (hdu.Image is not { } plane) continue;
                // One row at the top and one value at the far corner touch the first and the last tile.
                var row = new float[Math.Min(plane.Width, 1 << 16)];
                plane.ReadRow(0, 0, row);
                plane.ReadValue(plane.Width - 1, plane.Height - 1);
            }
        }
        catch (FitsFormatException)
        {
            // A typed rejection is the correct answer to a malformed file.
        }
    }
}
