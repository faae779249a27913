namespace Mosaic.Server.Access;

/// <summary>What a caller without any token may do.</summary>
public enum AnonymousAccess
{
    /// <summary>Nothing but /healthz and the sign-in page: the default once an access token is configured.</summary>
    None,

    /// <summary>Every field that is not private, including saving views and meetings: the default without a token.</summary>
    PublicFields,
}
