namespace Mosaic.Server.Meetings;

/// <summary>A new meeting: its id and the key that lets its holder drive it (shown once, never stored).</summary>
public sealed record MeetingStarted(string Id, string PresenterKey);
