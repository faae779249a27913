using System.Buffers;
using Mosaic.Fits;
using Mosaic.Fits.Writing;

namespace Mosaic.Server.Cutouts;

/// <summary>
/// Streams a cutout as a FITS file: the header, then the data a strip of rows at a time (about 1 MiB), so memory stays
/// a strip whatever the box. Everything that can be refused was checked before this runs; a read that fails midway
/// aborts the connection, so a client never keeps a file that looks whole.
/// </summary>
public sealed class CutoutResult(CutoutRequest request, CutoutPixels pixels, IReadOnlyList<HeaderCard> cards, string fileName) : IResult
{
    private const int StripBytes = 1 << 20;
    private const int BlockSize = 2880;

    public string FileName { get; } = fileName;

    public async Task ExecuteAsync(HttpContext httpContext)
    {
        ArgumentNullException.ThrowIfNull(httpContext);
        var response = httpContext.Response;
        var cancel = httpContext.RequestAborted;
        var box = request.Box;
        var rowBytes = box.Width * pixels.BytesPerSample;
        var rowsPerStrip = Math.Clamp(StripBytes / rowBytes, 1, box.Height);

        using var buffer = new MemoryStream();
        using var writer = new FitsWriter(buffer, leaveOpen: true);
        var data = writer.BeginImage(cards, pixels.BitPix, [box.Width, box.Height]);
        var padded = (data.ExpectedBytes + BlockSize - 1) / BlockSize * BlockSize;

        response.StatusCode = StatusCodes.Status200OK;
        response.ContentType = "application/fits";
        response.ContentLength = buffer.Length + padded;
        response.Headers.ContentDisposition = $"attachment; filename=\"{FileName}\"";
        response.Headers["X-Cutout-Box"] = $"{box.X0},{box.Y0},{box.X1},{box.Y1}";
        await Send(buffer, response, cancel);

        var strip = ArrayPool<byte>.Shared.Rent(rowsPerStrip * rowBytes);
        var scratch = ArrayPool<float>.Shared.Rent(box.Width);
        try
        {
            for (var first = 0; first < box.Height; first += rowsPerStrip)
            {
                var rows = Math.Min(rowsPerStrip, box.Height - first);
                var bytes = strip.AsMemory(0, rows * rowBytes);
                try
                {
                    pixels.ReadRows(box, first, rows, bytes.Span, scratch);
                }
                catch (FitsFormatException)
                {
                    httpContext.Abort();
                    throw;
                }
                data.WriteBigEndian(bytes.Span);
                await Send(buffer, response, cancel);
            }
            data.Complete();
            await Send(buffer, response, cancel);
        }
        finally
        {
            ArrayPool<byte>.Shared.Return(strip);
            ArrayPool<float>.Shared.Return(scratch);
        }
    }

    /// <summary>What the writer put in the buffer goes out, and the buffer starts again empty.</summary>
    private static async Task Send(MemoryStream buffer, HttpResponse response, CancellationToken cancel)
    {
        if (buffer.Length == 0) return;
        await response.Body.WriteAsync(buffer.GetBuffer().AsMemory(0, (int)buffer.Length), cancel);
        buffer.SetLength(0);
    }
}
