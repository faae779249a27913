namespace Mosaic.Server.Access;

/// <summary>An access option that cannot be used (unreadable token file, token too short, unknown mode): the server does not start.</summary>
public sealed class AccessOptionException(string option, string message) : Exception(message)
{
    /// <summary>The command-line option or environment variable at fault.</summary>
    public string Option { get; } = option;
}
