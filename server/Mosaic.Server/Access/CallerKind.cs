namespace Mosaic.Server.Access;

public enum CallerKind
{
    /// <summary>Holds an access token: every field, every action.</summary>
    Full,

    /// <summary>No token, where anonymous callers are let in: fields that are not private.</summary>
    Public,

    /// <summary>Holds a share token: reads of one field only.</summary>
    Share,
}
