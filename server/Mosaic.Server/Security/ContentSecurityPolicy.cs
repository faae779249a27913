using System.Security.Cryptography;
using System.Text;
using System.Text.RegularExpressions;
using Microsoft.Extensions.FileProviders;

namespace Mosaic.Server.Security;

/// <summary>
/// The Content-Security-Policy of every response. Scripts and styles come only from this origin; the page's one inline
/// script (the import map) is allowed by its SHA-256 hash, read from the page at start so an edit cannot be forgotten.
/// Images may also be data: (the map library's blank tile) and blob: (the picture export's preview); connections
/// (fetch and the meeting WebSocket) go only to this origin. No framing, no plugins, no base-URI rewriting.
/// </summary>
public static partial class ContentSecurityPolicy
{
    public static string For(IFileProvider webRoot)
    {
        ArgumentNullException.ThrowIfNull(webRoot);
        var scripts = new StringBuilder("'self'");
        foreach (var hash in InlineScriptHashes(webRoot, "index.html")) scripts.Append(" 'sha256-").Append(hash).Append('\'');
        return $"default-src 'self'; script-src {scripts}; style-src 'self'; img-src 'self' data: blob:; connect-src 'self'; " +
               "font-src 'self'; object-src 'none'; base-uri 'none'; form-action 'self'; frame-ancestors 'none'";
    }

    /// <summary>Base64 SHA-256 of each inline script's text, as CSP Level 3 hash sources are written.</summary>
    public static IEnumerable<string> InlineScriptHashes(IFileProvider webRoot, string page)
    {
        ArgumentNullException.ThrowIfNull(webRoot);
        var file = webRoot.GetFileInfo(page);
        if (!file.Exists) return [];
        using var reader = new StreamReader(file.CreateReadStream(), Encoding.UTF8);
        var html = reader.ReadToEnd();
        return InlineScript().Matches(html)
            .Select(m => Convert.ToBase64String(SHA256.HashData(Encoding.UTF8.GetBytes(m.Groups["body"].Value))))
            .ToList();
    }

    // A <script> without src: its body is what the browser hashes, byte for byte.
    [GeneratedRegex(@"<script(?![^>]*\bsrc\s*=)[^>]*>(?<body>.*?)</script>", RegexOptions.Singleline | RegexOptions.IgnoreCase)]
    private static partial Regex InlineScript();
}
