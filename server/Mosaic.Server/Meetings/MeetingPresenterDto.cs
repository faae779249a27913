namespace Mosaic.Server.Meetings;

/// <summary>Sent as "presenter" when someone else took over driving the meeting.</summary>
public sealed record MeetingPresenterDto(string? Name);
