namespace Mosaic.Server.Access;

public enum AccessRefusal
{
    /// <summary>The field (or the saved view's field) is not there for this caller: answered 404, as for a field that does not exist.</summary>
    Hidden,

    /// <summary>A share token reads; it does not write, meet or make links: 403.</summary>
    ReadOnly,

    /// <summary>Only an access-token holder may do this: 403.</summary>
    NeedsAccessToken,

    /// <summary>A meeting connection from a page of another origin: 403.</summary>
    ForeignOrigin,
}
