using System.IO.Hashing;
using System.Text;
using System.Text.Json;
using System.Text.RegularExpressions;
using Microsoft.Extensions.FileProviders;

namespace Mosaic.Server.ClientFiles;

/// <summary>
/// The viewer's page as sent: <c>index.html</c> with a <c>&lt;link rel="modulepreload"&gt;</c> for every module its
/// scripts import, directly or not, so the browser asks for the whole graph at once instead of discovering it one
/// import level at a time. Built from the web root and rebuilt when the page or any listed module changes on disk.
/// </summary>
public sealed partial class ClientPage(IFileProvider webRoot)
{
    public const string PageFile = "index.html";

    private readonly Lock _gate = new();
    private ClientPageContent? _built;

    /// <summary>The page, its strong ETag, and the modules it preloads; null when the web root has no page.</summary>
    public ClientPageContent? Current
    {
        get
        {
            lock (_gate)
            {
                if (_built is null || !_built.IsFresh(webRoot)) _built = Build(webRoot);
                return _built;
            }
        }
    }

    public static ClientPageContent? Build(IFileProvider webRoot)
    {
        ArgumentNullException.ThrowIfNull(webRoot);
        var page = webRoot.GetFileInfo(PageFile);
        if (!page.Exists) return null;
        string html;
        using (var reader = new StreamReader(page.CreateReadStream(), Encoding.UTF8)) html = reader.ReadToEnd();
        var entries = ModuleScript().Matches(html).Select(m => m.Groups["src"].Value).ToList();
        var modules = ModuleGraph.Walk(webRoot, entries, ImportMap(html));
        // Entry scripts are asked for by their own tags, first; the rest of the graph is preloaded right after the last.
        var entrySet = entries.ToHashSet(StringComparer.Ordinal);
        var preloads = modules.Where(m => !entrySet.Contains(m)).ToList();
        var last = ModuleScript().Matches(html).LastOrDefault();
        var end = last is null ? -1 : html.IndexOf("</script>", last.Index + last.Length, StringComparison.OrdinalIgnoreCase);
        var text = html;
        if (end >= 0 && preloads.Count > 0)
        {
            var links = new StringBuilder("\n  <!-- Added by the server: the rest of the module graph, asked for at once. -->");
            foreach (var module in preloads) links.Append("\n  <link rel=\"modulepreload\" href=\"").Append(module).Append("\">");
            text = html.Insert(end + "</script>".Length, links.ToString());
        }
        var bytes = Encoding.UTF8.GetBytes(text);
        var etag = $"\"{Convert.ToHexStringLower(XxHash128.Hash(bytes))}\"";
        var stamps = modules.Prepend(PageFile).Select(path => (path, Modified(webRoot, path))).ToList();
        return new ClientPageContent(bytes, etag, preloads, stamps);
    }

    internal static DateTimeOffset? Modified(IFileProvider webRoot, string path)
    {
        var file = webRoot.GetFileInfo(path);
        return file.Exists ? file.LastModified : null;
    }

    // The page's import map (one inline <script type="importmap">): bare specifier → address.
    private static Dictionary<string, string> ImportMap(string html)
    {
        var map = new Dictionary<string, string>(StringComparer.Ordinal);
        var found = ImportMapScript().Match(html);
        if (!found.Success) return map;
        try
        {
            using var json = JsonDocument.Parse(found.Groups["body"].Value);
            if (json.RootElement.TryGetProperty("imports", out var imports) && imports.ValueKind == JsonValueKind.Object)
                foreach (var entry in imports.EnumerateObject())
                    if (entry.Value.ValueKind == JsonValueKind.String) map[entry.Name] = entry.Value.GetString()!;
        }
        catch (JsonException)
        {
            // The browser reports a broken import map itself; the page is still sent, only without those preloads.
        }
        return map;
    }

    [GeneratedRegex(@"<script\b[^>]*\btype\s*=\s*[""']module[""'][^>]*\bsrc\s*=\s*[""'](?<src>[^""']+)[""'][^>]*>", RegexOptions.IgnoreCase)]
    private static partial Regex ModuleScript();

    [GeneratedRegex(@"<script\b[^>]*\btype\s*=\s*[""']importmap[""'][^>]*>(?<body>.*?)</script>", RegexOptions.IgnoreCase | RegexOptions.Singleline)]
    private static partial Regex ImportMapScript();
}
