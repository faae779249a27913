namespace Mosaic.Server.Errors;

/// <summary>The tiles asked for need a pyramid still being built: the client retries after a moment.</summary>
public sealed class PyramidNotReadyException(string detail, double progress)
    : MosaicRequestException(StatusCodes.Status503ServiceUnavailable, "Pyramid not ready", detail)
{
    public double Progress { get; } = progress;

    public int RetryAfterSeconds => 1;
}
