namespace Mosaic.Server.Meetings;

/// <summary>How many meetings the server keeps, how large what they carry may be, and how long an idle one lives.</summary>
public sealed class MeetingLimits
{
    /// <summary>Meetings open at once; starting one more is refused until one ends or expires.</summary>
    public int MaxMeetings { get; init; } = 1000;

    /// <summary>People in one meeting, presenter included.</summary>
    public int MaxParticipants { get; init; } = 500;

    /// <summary>Parameters in one view state (the same bound as a saved view's).</summary>
    public int MaxStateKeys { get; init; } = 200;

    /// <summary>Bytes of one view state: its keys and values in UTF-8 (the same bound as a saved view's).</summary>
    public int MaxStateBytes { get; init; } = 16 * 1024;

    /// <summary>A meeting ends by itself this long after its presenter last did anything.</summary>
    public TimeSpan Expiry { get; init; } = TimeSpan.FromHours(4);

    /// <summary>A hand-over code not used within this time stops working.</summary>
    public TimeSpan HandOverLifetime { get; init; } = TimeSpan.FromMinutes(30);

    /// <summary>The largest message a client may send the hub: a full state with room for JSON escaping.</summary>
    public long MaxMessageBytes { get; init; } = 64 * 1024;
}
