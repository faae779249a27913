namespace Mosaic.Server.Meetings;

/// <summary>A refused meeting request, with why and which part of the request was to blame.</summary>
public sealed class MeetingException(MeetingError error, string message, string? parameter = null) : Exception(message)
{
    public MeetingError Error { get; } = error;

    /// <summary>The argument or body member at fault (e.g. <c>state.field</c>), where there is one.</summary>
    public string? Parameter { get; } = parameter;
}
