namespace Mosaic.Server.Meetings;

/// <summary>A meeting a connection was in, and how many people are in it now.</summary>
public sealed record MeetingMembership(string MeetingId, int Participants);
