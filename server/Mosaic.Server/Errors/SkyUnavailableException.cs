namespace Mosaic.Server.Errors;

/// <summary>A request needs sky coordinates that an HDU (or every HDU of a band) does not have.</summary>
public sealed class SkyUnavailableException(string detail, string? skyError, string? parameter = null) : Exception(detail)
{
    /// <summary>Why the WCS could not be used, as the HDU reports it in <c>skyError</c>.</summary>
    public string? SkyError { get; } = skyError;

    public string? Parameter { get; } = parameter;
}
