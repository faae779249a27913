namespace Mosaic.Server.Meetings;

/// <summary>
/// Meetings in this server's memory: lost on restart and not shared between servers. One lock guards everything;
/// meetings are few and every operation is short. Expired meetings are dropped as they are met and before a new
/// one is counted against the limit.
/// </summary>
public sealed class InMemoryMeetingStore(MeetingLimits limits, TimeProvider clock) : IMeetingStore
{
    private readonly Lock _gate = new();
    private readonly Dictionary<string, MeetingRecord> _meetings = new(StringComparer.Ordinal);
    private readonly Dictionary<string, string> _meetingOfConnection = new(StringComparer.Ordinal);

    public int Count
    {
        get
        {
            lock (_gate)
            {
                DropExpired();
                return _meetings.Count;
            }
        }
    }

    public MeetingStarted Start(IReadOnlyDictionary<string, string> state)
    {
        var key = MeetingSecrets.NewKey();
        lock (_gate)
        {
            DropExpired();
            if (_meetings.Count >= limits.MaxMeetings)
                throw new MeetingException(MeetingError.Full, $"The server already holds {limits.MaxMeetings} meetings; end one or try again later.");
            string id;
            do id = MeetingSecrets.NewId(); while (_meetings.ContainsKey(id));
            _meetings[id] = new MeetingRecord(Copy(state), MeetingSecrets.Hash(key), Now);
            return new MeetingStarted(id, key);
        }
    }

    public MeetingJoined Join(string id, string connectionId)
    {
        lock (_gate)
        {
            var meeting = Find(id);
            MeetingMembership? left = null;
            if (_meetingOfConnection.TryGetValue(connectionId, out var previous) && previous != id)
                left = LeaveLocked(connectionId);
            if (!meeting.Connections.Contains(connectionId) && meeting.Connections.Count >= limits.MaxParticipants)
                throw new MeetingException(MeetingError.Full, $"Meeting '{id}' already has {limits.MaxParticipants} participants.");
            meeting.Connections.Add(connectionId);
            _meetingOfConnection[connectionId] = id;
            return new MeetingJoined(meeting.State, meeting.Connections.Count, left);
        }
    }

    public MeetingMembership? Leave(string connectionId)
    {
        lock (_gate) return LeaveLocked(connectionId);
    }

    public void Present(string id, string presenterKey, IReadOnlyDictionary<string, string> state)
    {
        lock (_gate)
        {
            var meeting = Presenting(id, presenterKey);
            meeting.State = Copy(state);
        }
    }

    public void Authorize(string id, string presenterKey)
    {
        lock (_gate) Presenting(id, presenterKey);
    }

    public string HandOver(string id, string presenterKey)
    {
        var code = MeetingSecrets.NewKey();
        lock (_gate)
        {
            var meeting = Presenting(id, presenterKey);
            meeting.HandOverHash = MeetingSecrets.Hash(code);
            meeting.HandOverUntil = Now + limits.HandOverLifetime;
            return code;
        }
    }

    public string TakeOver(string id, string code)
    {
        var key = MeetingSecrets.NewKey();
        lock (_gate)
        {
            var meeting = Find(id);
            var valid = MeetingSecrets.Matches(code, meeting.HandOverHash);
            if (!valid || Now > meeting.HandOverUntil)
                throw new MeetingException(MeetingError.WrongKey,
                    valid ? "This hand-over code has expired; ask the presenter for a new one."
                          : "This hand-over code is not valid for this meeting (it may have been used already).", "code");
            meeting.KeyHash = MeetingSecrets.Hash(key);
            meeting.HandOverHash = null;
            meeting.LastActivity = Now;
            return key;
        }
    }

    public void End(string id, string presenterKey)
    {
        lock (_gate)
        {
            var meeting = Presenting(id, presenterKey);
            Remove(id, meeting);
        }
    }

    private DateTimeOffset Now => clock.GetUtcNow();

    private MeetingRecord Find(string id)
    {
        if (!MeetingSecrets.IsWellFormedId(id))
            throw new MeetingException(MeetingError.BadInput, "A meeting id is 8 to 64 letters, digits, '-' or '_'.", "id");
        if (!_meetings.TryGetValue(id, out var meeting))
            throw new MeetingException(MeetingError.NotFound, $"There is no meeting '{id}': it has ended or never existed.", "id");
        if (IsExpired(meeting))
        {
            Remove(id, meeting);
            throw new MeetingException(MeetingError.NotFound, $"Meeting '{id}' has ended: its presenter was idle for too long.", "id");
        }
        return meeting;
    }

    private MeetingRecord Presenting(string id, string presenterKey)
    {
        var meeting = Find(id);
        if (!MeetingSecrets.Matches(presenterKey, meeting.KeyHash))
            throw new MeetingException(MeetingError.WrongKey,
                "This presenter key does not drive the meeting: it is wrong, or the meeting was handed over to someone else.", "key");
        meeting.LastActivity = Now;
        return meeting;
    }

    private bool IsExpired(MeetingRecord meeting) => Now - meeting.LastActivity > limits.Expiry;

    private void DropExpired()
    {
        foreach (var (id, meeting) in _meetings.Where(m => IsExpired(m.Value)).ToList()) Remove(id, meeting);
    }

    private void Remove(string id, MeetingRecord meeting)
    {
        _meetings.Remove(id);
        foreach (var connection in meeting.Connections) _meetingOfConnection.Remove(connection);
    }

    private MeetingMembership? LeaveLocked(string connectionId)
    {
        if (!_meetingOfConnection.Remove(connectionId, out var id) || !_meetings.TryGetValue(id, out var meeting)) return null;
        meeting.Connections.Remove(connectionId);
        return new MeetingMembership(id, meeting.Connections.Count);
    }

    private static Dictionary<string, string> Copy(IReadOnlyDictionary<string, string> state) => new(state, StringComparer.Ordinal);
}
