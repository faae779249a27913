namespace Mosaic.Server.Rendering;

/// <summary>
/// A rendered PNG sent in slices, each awaited until the connection has taken it. Kestrel copies what is written
/// into its pinned buffers before sending, so one write of a whole 50-megapixel image (up to 150 MB) would pin as
/// much again; a slice at a time pins about one slice.
/// </summary>
public sealed class PngResponse(byte[] png) : IResult
{
    private const int SliceBytes = 256 << 10;

    public byte[] Png { get; } = png;

    public async Task ExecuteAsync(HttpContext httpContext)
    {
        ArgumentNullException.ThrowIfNull(httpContext);
        var response = httpContext.Response;
        response.StatusCode = StatusCodes.Status200OK;
        response.ContentType = "image/png";
        response.ContentLength = Png.Length;
        for (var offset = 0; offset < Png.Length; offset += SliceBytes)
            await response.Body.WriteAsync(Png.AsMemory(offset, Math.Min(SliceBytes, Png.Length - offset)), httpContext.RequestAborted);
    }
}
