namespace Mosaic.Server.Meetings;

/// <summary>
/// What a connection finds on joining: the presenter's current view state, how many are in the meeting now, and
/// the meeting it left to join this one (null if none), whose count went down.
/// </summary>
public sealed record MeetingJoined(IReadOnlyDictionary<string, string> State, int Participants, MeetingMembership? Left);
