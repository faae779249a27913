namespace Mosaic.Testing;

/// <summary>How an outside program ended: its exit code and everything it wrote.</summary>
public sealed record ProgramResult(int ExitCode, string Stdout, string Stderr);
