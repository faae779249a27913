namespace Mosaic.Server.Fields;

/// <summary>A file of a field that cannot be shown, and why; the rest of the field is still served.</summary>
public sealed record FieldProblem(string File, string Error);
