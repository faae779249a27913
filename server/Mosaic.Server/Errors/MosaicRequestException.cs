namespace Mosaic.Server.Errors;

/// <summary>A request Mosaic cannot serve, with the status and the parameter to blame; turned into problem details in one place.</summary>
public class MosaicRequestException(int status, string title, string detail, string? parameter = null) : Exception(detail)
{
    public int Status { get; } = status;

    public string Title { get; } = title;

    /// <summary>The query or route parameter that was wrong, where one was.</summary>
    public string? Parameter { get; } = parameter;

    public static MosaicRequestException BadParameter(string parameter, string detail) =>
        new(StatusCodes.Status400BadRequest, $"Invalid parameter '{parameter}'", detail, parameter);

    public static MosaicRequestException NotFound(string what, string detail, string? parameter = null) =>
        new(StatusCodes.Status404NotFound, $"{what} not found", detail, parameter);
}
