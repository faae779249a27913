namespace Mosaic.Server.Access;

/// <summary>What the page may offer: caller is "full", "public" or "share" (then field and expires say which field, until when).</summary>
public sealed record CallerDto(string Caller, string? Field, DateTime? Expires, bool CanShare, bool TokenRequired);
