namespace Mosaic.Server.Meetings;

/// <summary>One meeting as the in-memory store keeps it; guarded by the store's lock.</summary>
internal sealed class MeetingRecord(IReadOnlyDictionary<string, string> state, byte[] keyHash, DateTimeOffset started)
{
    public IReadOnlyDictionary<string, string> State { get; set; } = state;

    /// <summary>SHA-256 of the presenter key; the key itself is never kept.</summary>
    public byte[] KeyHash { get; set; } = keyHash;

    public byte[]? HandOverHash { get; set; }

    public DateTimeOffset HandOverUntil { get; set; }

    /// <summary>The last time the presenter did anything; the meeting expires a while after.</summary>
    public DateTimeOffset LastActivity { get; set; } = started;

    public HashSet<string> Connections { get; } = new(StringComparer.Ordinal);
}
