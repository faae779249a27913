namespace Mosaic.Fits.Writing;

/// <summary>
/// The samples of an uncompressed image exactly as stored (big-endian, the file's BITPIX, before BSCALE/BZERO), for
/// copies that keep the original type and scaling bit for bit. Reads through the plane's own open handle, so a file
/// replaced on disk since it was opened is never mixed in.
/// </summary>
public static class StoredSamples
{
    /// <summary>Row <paramref name="y"/> (0-based, row 0 = FITS y = 1), columns [x, x + n), n = destination.Length / bytes per sample.</summary>
    public static void ReadRow(RawImagePlane plane, int y, int x, Span<byte> destination)
    {
        ArgumentNullException.ThrowIfNull(plane);
        var size = plane.BytesPerPixel;
        if (destination.Length % size != 0)
            throw new ArgumentException($"{destination.Length} bytes are not whole samples of {size} bytes.", nameof(destination));
        var count = destination.Length / size;
        ArgumentOutOfRangeException.ThrowIfNegative(y);
        ArgumentOutOfRangeException.ThrowIfGreaterThanOrEqual(y, plane.Height);
        ArgumentOutOfRangeException.ThrowIfNegative(x);
        if ((long)x + count > plane.Width)
            throw new ArgumentOutOfRangeException(nameof(destination), count, $"columns [{x}, {(long)x + count}) run past the row width {plane.Width}.");
        if (count == 0) return;

        ObjectDisposedException.ThrowIf(plane.Handle.IsClosed, plane);
        var offset = plane.DataOffset + ((long)y * plane.Width + x) * size;
        var done = 0;
        while (done < destination.Length)
        {
            int n;
            try
            {
                n = RandomAccess.Read(plane.Handle, destination[done..], offset + done);
            }
            catch (IOException e)
            {
                throw new FitsFormatException(plane.FilePath, plane.HduIndex, null, $"cannot read pixel data at byte {offset + done}: {e.Message}", e);
            }
            if (n == 0)
                throw new FitsFormatException(plane.FilePath, plane.HduIndex, null,
                    $"truncated data: the file ends before byte {offset + destination.Length} (it was cut short or rewritten after opening)");
            done += n;
        }
    }
}
