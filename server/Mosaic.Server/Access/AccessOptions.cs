using System.Globalization;

namespace Mosaic.Server.Access;

/// <summary>
/// Who may see what, read from --access-token-file (one token a line, '#' comments), MOSAIC_ACCESS_TOKEN,
/// --anonymous (none | public), --private-fields (comma-separated ids) and --allowed-origins (comma-separated).
/// Tokens come from a file or the environment so that none is on a command line, where any local user can read it.
/// </summary>
public sealed class AccessOptions
{
    /// <summary>Shorter tokens are refused: 16 characters is a floor against guessing, not a recommendation (common practice: 32 random bytes).</summary>
    public const int MinimumTokenLength = 16;

    public static readonly TimeSpan MinimumShareLifetime = TimeSpan.FromMinutes(1);

    public static readonly TimeSpan MaximumShareLifetime = TimeSpan.FromDays(90);

    public AccessTokens Tokens { get; init; } = AccessTokens.None;

    public AnonymousAccess Anonymous { get; init; } = AnonymousAccess.PublicFields;

    /// <summary>Field ids private by option, besides those with a marker file (see <see cref="Fields.Field.IsPrivate"/>).</summary>
    public IReadOnlySet<string> PrivateFields { get; init; } = new HashSet<string>(StringComparer.Ordinal);

    /// <summary>Origins (scheme://host[:port]) besides the server's own that may open a meeting connection.</summary>
    public IReadOnlySet<string> AllowedOrigins { get; init; } = new HashSet<string>(StringComparer.OrdinalIgnoreCase);

    public static AccessOptions FromConfiguration(IConfiguration configuration)
    {
        ArgumentNullException.ThrowIfNull(configuration);
        var tokens = new List<string>();
        if (configuration["access-token-file"] is { Length: > 0 } file) tokens.AddRange(ReadTokenFile(file));
        if (configuration["MOSAIC_ACCESS_TOKEN"] is { Length: > 0 } variable) tokens.Add(Check("MOSAIC_ACCESS_TOKEN", variable.Trim()));
        var anonymous = configuration["anonymous"] switch
        {
            null or "" => tokens.Count == 0 ? AnonymousAccess.PublicFields : AnonymousAccess.None,
            "none" => AnonymousAccess.None,
            "public" => AnonymousAccess.PublicFields,
            var other => throw new AccessOptionException("--anonymous", $"--anonymous must be 'none' or 'public'; got '{other}'."),
        };
        if (anonymous == AnonymousAccess.None && tokens.Count == 0)
            throw new AccessOptionException("--anonymous", "--anonymous none needs an access token (--access-token-file or MOSAIC_ACCESS_TOKEN); otherwise no one could get in.");
        return new AccessOptions
        {
            Tokens = new AccessTokens(tokens),
            Anonymous = anonymous,
            PrivateFields = List(configuration["private-fields"]).ToHashSet(StringComparer.Ordinal),
            AllowedOrigins = List(configuration["allowed-origins"]).Select(o => Origin("--allowed-origins", o)).ToHashSet(StringComparer.OrdinalIgnoreCase),
        };
    }

    private static IEnumerable<string> ReadTokenFile(string path)
    {
        string[] lines;
        try
        {
            lines = File.ReadAllLines(path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new AccessOptionException("--access-token-file", $"--access-token-file '{path}' cannot be read: {e.Message}");
        }
        var tokens = lines.Select(l => l.Trim()).Where(l => l.Length > 0 && !l.StartsWith('#')).Select(t => Check("--access-token-file", t)).ToList();
        if (tokens.Count == 0)
            throw new AccessOptionException("--access-token-file", $"--access-token-file '{path}' holds no token (one a line; '#' starts a comment).");
        return tokens;
    }

    private static string Check(string option, string token)
    {
        if (token.Length < MinimumTokenLength)
            throw new AccessOptionException(option, string.Create(CultureInfo.InvariantCulture, $"An access token from {option} has {token.Length} characters; at least {MinimumTokenLength} are needed."));
        if (token.Any(c => c <= ' ' || c > '~'))
            throw new AccessOptionException(option, $"An access token from {option} holds a space, control or non-ASCII character; use printable ASCII only.");
        return token;
    }

    private static IEnumerable<string> List(string? text) =>
        (text ?? "").Split(',', StringSplitOptions.TrimEntries | StringSplitOptions.RemoveEmptyEntries);

    private static string Origin(string option, string text)
    {
        if (!Uri.TryCreate(text, UriKind.Absolute, out var uri) || uri.Scheme is not ("http" or "https") || uri.PathAndQuery != "/" || uri.UserInfo.Length > 0)
            throw new AccessOptionException(option, $"'{text}' in {option} is not an origin such as https://viewer.example:8443.");
        return uri.GetLeftPart(UriPartial.Authority);
    }
}
