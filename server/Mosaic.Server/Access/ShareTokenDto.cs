namespace Mosaic.Server.Access;

/// <summary>A new share token: add it to a page link as ?token= to open that field read-only until expires.</summary>
public sealed record ShareTokenDto(string Token, string Field, DateTime Expires, string Scope);
