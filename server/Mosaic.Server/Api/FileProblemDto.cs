namespace Mosaic.Server.Api;

/// <summary>A file of the field that cannot be shown, and why.</summary>
public sealed record FileProblemDto(string File, string Error);
