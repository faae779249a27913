namespace Mosaic.Server.Meetings;

/// <summary>The answer to starting a meeting: its id, the link that joins it, and the key that drives it.</summary>
public sealed record MeetingStartedDto(string Id, string JoinUrl, string PresenterKey);
