namespace Mosaic.Fits.Parsing;

/// <summary>One 80-byte keyword record, before CONTINUE pieces are joined.</summary>
/// <param name="Continues">A string value whose last non-space character is '&amp;' (its value already has the '&amp;' removed).</param>
internal readonly record struct ParsedRecord(RecordKind Kind, string Keyword, object? Value, string? Comment, bool Continues);
