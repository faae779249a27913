namespace Mosaic.Server.Api;

/// <summary>One row of a field's list of saved views.</summary>
public sealed record ViewSummaryDto(string Id, string Url, string Field, string? Title, string? Note, DateTime Created, string Link);
