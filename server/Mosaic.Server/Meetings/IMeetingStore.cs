namespace Mosaic.Server.Meetings;

/// <summary>
/// Where meetings live: their view state, the hash of the presenter key, a pending hand-over and who is connected.
/// Every method throws <see cref="MeetingException"/> for an unknown or expired meeting, a wrong key or code, and a
/// full server or meeting. Keys and codes are compared in constant time.
/// </summary>
public interface IMeetingStore
{
    /// <summary>Meetings open now (expired ones not counted).</summary>
    int Count { get; }

    /// <summary>Starts a meeting showing <paramref name="state"/> (already checked).</summary>
    MeetingStarted Start(IReadOnlyDictionary<string, string> state);

    /// <summary>Adds connection <paramref name="connectionId"/> to meeting <paramref name="id"/>, leaving any other it was in.</summary>
    MeetingJoined Join(string id, string connectionId);

    /// <summary>Takes the connection out of its meeting; null if it was in none.</summary>
    MeetingMembership? Leave(string connectionId);

    /// <summary>The presenter's new view state (already checked).</summary>
    void Present(string id, string presenterKey, IReadOnlyDictionary<string, string> state);

    /// <summary>Checks that <paramref name="presenterKey"/> drives meeting <paramref name="id"/>, and counts as presenter activity.</summary>
    void Authorize(string id, string presenterKey);

    /// <summary>A one-time code with which another participant takes over; replaces any earlier code.</summary>
    string HandOver(string id, string presenterKey);

    /// <summary>Uses up a hand-over code: returns the new presenter key, and the old key stops working.</summary>
    string TakeOver(string id, string code);

    /// <summary>Ends the meeting for everyone.</summary>
    void End(string id, string presenterKey);
}
