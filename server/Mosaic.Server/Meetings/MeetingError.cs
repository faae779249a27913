namespace Mosaic.Server.Meetings;

/// <summary>Why a meeting request was refused.</summary>
public enum MeetingError
{
    /// <summary>No meeting has that id (never started, ended or expired).</summary>
    NotFound,

    /// <summary>The presenter key or hand-over code is wrong, used up or out of date.</summary>
    WrongKey,

    /// <summary>A view state, pointer or id that is not well formed.</summary>
    BadInput,

    /// <summary>The state names a field the server does not have.</summary>
    UnknownField,

    /// <summary>Too many meetings, or too many people in one.</summary>
    Full,
}
