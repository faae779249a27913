using System.Text.Json;
using Microsoft.Extensions.FileProviders;
using Mosaic.Server.ClientFiles;
using Mosaic.Testing;

namespace Mosaic.Server.Tests.ClientFiles;

/// <summary>
/// The page the server sends preloads the client's whole static module graph, as the JavaScript engine itself reads
/// it: every module's import specifiers are compared with V8's parse (Node's vm.SourceTextModule, the engine
/// Chromium runs), and the preload list with the closure of those imports resolved by WHATWG URL rules.
/// </summary>
public sealed class ClientPageTests(ClientSiteFixture site) : IClassFixture<ClientSiteFixture>
{
    // Node walks the graph from the page's entry modules: each file's dependencySpecifiers (V8's module parser),
    // each resolved against the importing file's URL (WHATWG URL) or through the import map for a bare name.
    private const string NodeWalk = """
        const vm = require('node:vm');
        const fs = require('node:fs');
        const path = require('node:path');
        const [root, entriesJson, mapJson] = process.argv.slice(1);
        const base = 'http://client.invalid/';
        const map = JSON.parse(mapJson);
        const imports = {};
        const queue = JSON.parse(entriesJson);
        const order = [];
        while (queue.length > 0) {
          const file = queue.shift();
          if (file in imports) continue;
          const specifiers = new vm.SourceTextModule(fs.readFileSync(path.join(root, file), 'utf8'), { identifier: file }).dependencySpecifiers;
          imports[file] = specifiers;
          order.push(file);
          for (const s of specifiers) {
            const target = new URL(map[s] ?? s, map[s] ? base : base + file).pathname.slice(1);
            if (!(target in imports)) queue.push(target);
          }
        }
        console.log(JSON.stringify({ imports, order }));
        """;

    [Fact]
    public void Each_modules_imports_are_the_specifiers_V8_parses_and_the_preloads_are_their_closure()
    {
        var webRoot = new PhysicalFileProvider(site.WebRoot);
        var page = ClientPage.Build(webRoot);
        Assert.NotNull(page);
        string[] entries = ["boot.js", "app.js"];
        var map = new Dictionary<string, string> { ["leaflet"] = "./lib/leaflet/leaflet-src.esm.js" };
        var node = ExternalProgram.Run(NodeProgram(), ["--experimental-vm-modules", "-e", NodeWalk, site.WebRoot,
            JsonSerializer.Serialize(entries), JsonSerializer.Serialize(map)]);
        Assert.True(node.ExitCode == 0, $"node failed: {node.Stderr}");
        using var reference = JsonDocument.Parse(node.Stdout);

        var v8Imports = reference.RootElement.GetProperty("imports").EnumerateObject()
            .ToDictionary(p => p.Name, p => p.Value.EnumerateArray().Select(s => s.GetString()!).ToList());
        // The client is a real graph, Leaflet included, not a handful of files.
        Assert.True(v8Imports.Count > 40, $"only {v8Imports.Count} modules reached");
        Assert.Contains("lib/leaflet/leaflet-src.esm.js", v8Imports.Keys);
        foreach (var (file, specifiers) in v8Imports)
        {
            var source = File.ReadAllText(Path.Combine(site.WebRoot, file));
            Assert.True(specifiers.SequenceEqual(ModuleGraph.Imports(source)), $"{file}: V8 reads [{string.Join(", ", specifiers)}], " +
                $"the server [{string.Join(", ", ModuleGraph.Imports(source))}]");
        }
        var closure = reference.RootElement.GetProperty("order").EnumerateArray().Select(e => e.GetString()!).ToHashSet();
        Assert.Equal(closure.Except(entries).Order(StringComparer.Ordinal), page.Preloads.Order(StringComparer.Ordinal));
        Assert.Equal(page.Preloads.Count, page.Preloads.Distinct().Count());
    }

    [Fact]
    public void Imports_are_read_in_every_form_of_the_ECMAScript_grammar_and_nowhere_else()
    {
        // ECMA-262 (2024) 16.2.2 ImportDeclaration and 16.2.3 ExportDeclaration: the forms that name a module.
        // Dynamic import() (13.3.10) loads later and is left out, as are comments and the word in a string.
        const string source = """
            import './side-effect.js';
            import def from "./default.js";
            import * as all from './namespace.js';
            import { a, b as c } from './named.js';
            import def2, { d } from './both.js';
            import {
              e,
              f,
            } from './multi-line.js';
            export { g } from './re-export.js';
            export * from './star.js';
            export * as h from './star-as.js';
            import L from 'leaflet';
            // import x from './commented.js';
            /* import y from './block-comment.js'; */
            const later = import('./dynamic.js');
            const text = "import z from './in-a-string.js'";
            export const value = 1;
            """;
        // Checked by hand against the grammar above (an order and list of our own, not copied from the code's output).
        string[] expected = ["./side-effect.js", "./default.js", "./namespace.js", "./named.js", "./both.js", "./multi-line.js",
            "./re-export.js", "./star.js", "./star-as.js", "leaflet"];
        Assert.Equal(expected, ModuleGraph.Imports(source));
    }

    [Theory]
    // WHATWG URL Standard, relative resolution: "./" stays in the importer's folder, "../" climbs one, "/" is the root.
    [InlineData("app.js", "./api.js", "api.js")]
    [InlineData("lib/x/a.js", "./b.js", "lib/x/b.js")]
    [InlineData("lib/x/a.js", "../y/c.js", "lib/y/c.js")]
    [InlineData("lib/x/a.js", "/top.js", "top.js")]
    [InlineData("app.js", "leaflet", "lib/leaflet/leaflet-src.esm.js")]
    public void Specifiers_resolve_as_URLs_do(string importer, string specifier, string expected)
    {
        var map = new Dictionary<string, string> { ["leaflet"] = "./lib/leaflet/leaflet-src.esm.js" };
        Assert.Equal(expected, ModuleGraph.Resolve(importer, specifier, map));
    }

    [Theory]
    // Not on this origin's web root, or not a name the import map knows: nothing to preload.
    [InlineData("app.js", "../outside.js")]
    [InlineData("app.js", "https://elsewhere.invalid/x.js")]
    [InlineData("app.js", "unknown-package")]
    public void Specifiers_off_the_web_root_are_not_preloaded(string importer, string specifier)
    {
        Assert.Null(ModuleGraph.Resolve(importer, specifier, new Dictionary<string, string>()));
    }

    [Fact]
    public async Task The_page_sent_is_index_html_with_one_preload_per_module_as_an_HTML_parser_reads_it()
    {
        var sent = await site.Client.GetStringAsync("/");
        var file = await File.ReadAllTextAsync(Path.Combine(site.WebRoot, "index.html"));
        // Python's html.parser (Debian python3), an HTML reader of its own, lists the page's link and script elements.
        var elements = DebianPython.RunCode("""
            import html.parser, json, sys
            class Links(html.parser.HTMLParser):
                def __init__(self):
                    super().__init__()
                    self.found = []
                def handle_starttag(self, tag, attrs):
                    a = dict(attrs)
                    if tag == "link" and a.get("rel") == "modulepreload": self.found.append(["preload", a.get("href")])
                    if tag == "script" and a.get("type") == "module": self.found.append(["module", a.get("src")])
            p = Links()
            p.feed(sys.stdin.read())
            print(json.dumps(p.found))
            """, standardInput: sent);
        using var parsed = JsonDocument.Parse(elements);
        var found = parsed.RootElement.EnumerateArray().Select(e => (Kind: e[0].GetString(), Href: e[1].GetString())).ToList();
        var preloads = found.Where(e => e.Kind == "preload").Select(e => e.Href ?? "").ToList();
        var page = ClientPage.Build(new PhysicalFileProvider(site.WebRoot))!;
        Assert.Equal(page.Preloads.ToList(), preloads);
        // The entry modules come first, so the requests they start are not queued behind the preloads.
        Assert.Equal([("module", "boot.js"), ("module", "app.js")], found.Take(2));
        // Nothing else of the page changes: without the added lines it is the file as built.
        static bool Added(string line) => line.Contains("rel=\"modulepreload\"", StringComparison.Ordinal)
            || line.Contains("Added by the server", StringComparison.Ordinal);
        Assert.Equal(file.Replace("\r\n", "\n"), string.Join('\n', sent.Split('\n').Where(line => !Added(line))).Replace("\r\n", "\n"));
    }

    private static string NodeProgram()
    {
        foreach (var folder in (Environment.GetEnvironmentVariable("PATH") ?? "").Split(Path.PathSeparator))
        {
            var candidate = Path.Combine(folder, "node");
            if (File.Exists(candidate)) return candidate;
        }
        throw new InvalidOperationException("node (Node.js) is not on PATH: it is needed to build the client (npm) and by this test (Debian: apt-get install nodejs)");
    }
}
