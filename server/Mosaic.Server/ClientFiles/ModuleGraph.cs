using System.Text.RegularExpressions;
using Microsoft.Extensions.FileProviders;

namespace Mosaic.Server.ClientFiles;

/// <summary>
/// The client's static module graph: every module file reachable by static <c>import … from</c> / <c>export … from</c>
/// from the page's entry modules, as web-root paths in the order a breadth-first walk meets them. Bare specifiers go
/// through the page's import map; dynamic <c>import()</c> is not followed (those modules load later on purpose).
/// </summary>
public static partial class ModuleGraph
{
    public static IReadOnlyList<string> Walk(IFileProvider webRoot, IEnumerable<string> entries, IReadOnlyDictionary<string, string> importMap)
    {
        ArgumentNullException.ThrowIfNull(webRoot);
        ArgumentNullException.ThrowIfNull(entries);
        ArgumentNullException.ThrowIfNull(importMap);
        var order = new List<string>();
        var seen = new HashSet<string>(StringComparer.Ordinal);
        var queue = new Queue<string>();
        foreach (var entry in entries)
            if (Normalise(entry) is { } path && seen.Add(path)) queue.Enqueue(path);
        while (queue.Count > 0)
        {
            var path = queue.Dequeue();
            var file = webRoot.GetFileInfo(path);
            if (!file.Exists || file.IsDirectory) continue; // a missing import fails in the browser with its own message
            order.Add(path);
            foreach (var specifier in Imports(Read(file)))
            {
                var target = Resolve(path, specifier, importMap);
                if (target is not null && seen.Add(target)) queue.Enqueue(target);
            }
        }
        return order;
    }

    /// <summary>The specifiers of a module's static imports and re-exports (comments are not read as code).</summary>
    public static IEnumerable<string> Imports(string source)
    {
        ArgumentNullException.ThrowIfNull(source);
        var code = Comment().Replace(source, " ");
        return StaticImport().Matches(code).Select(m => m.Groups["spec"].Value);
    }

    /// <summary>A specifier as a web-root path ("lib/x.js"), or null when it leaves the origin or is an unknown bare name.</summary>
    public static string? Resolve(string importer, string specifier, IReadOnlyDictionary<string, string> importMap)
    {
        ArgumentNullException.ThrowIfNull(importer);
        ArgumentNullException.ThrowIfNull(specifier);
        ArgumentNullException.ThrowIfNull(importMap);
        if (importMap.TryGetValue(specifier, out var mapped)) return Normalise(mapped);
        if (!(specifier.StartsWith("./", StringComparison.Ordinal) || specifier.StartsWith("../", StringComparison.Ordinal)
              || specifier.StartsWith('/'))) return null;
        if (specifier.StartsWith('/')) return Normalise(specifier);
        var slash = importer.LastIndexOf('/');
        return Normalise((slash < 0 ? "" : importer[..(slash + 1)]) + specifier);
    }

    // "./a/../b.js" → "b.js"; null when it climbs above the web root or carries a query or fragment.
    private static string? Normalise(string path)
    {
        if (path.Contains('?') || path.Contains('#') || path.Contains(':')) return null;
        var parts = new List<string>();
        foreach (var part in path.Split('/'))
        {
            if (part is "" or ".") continue;
            if (part == "..")
            {
                if (parts.Count == 0) return null;
                parts.RemoveAt(parts.Count - 1);
                continue;
            }
            parts.Add(part);
        }
        return parts.Count == 0 ? null : string.Join('/', parts);
    }

    private static string Read(IFileInfo file)
    {
        using var reader = new StreamReader(file.CreateReadStream());
        return reader.ReadToEnd();
    }

    // Block and line comments; a "//" inside a string would cut it short, which at worst misses an import.
    [GeneratedRegex(@"/\*.*?\*/|(?<![:'""\\])//[^\n]*", RegexOptions.Singleline)]
    private static partial Regex Comment();

    // At a statement start: import 'x'; import a, { b } from 'x'; import * as c from 'x'; export { d } from 'x'.
    [GeneratedRegex(@"(?:^|[;}\n])\s*(?:import\s*(?:[\w$*{}\s,]+?\s*from\s*)?|export\s*(?:\*(?:\s*as\s+[\w$]+)?|\{[^}]*\})\s*from\s*)(?<q>['""])(?<spec>[^'""\n]+)\k<q>")]
    private static partial Regex StaticImport();
}
