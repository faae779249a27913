using Microsoft.Extensions.FileProviders;

namespace Mosaic.Server.ClientFiles;

/// <summary>One build of the page: its bytes, strong ETag, the modules it preloads, and the files it was made from.</summary>
public sealed class ClientPageContent(byte[] bytes, string etag, IReadOnlyList<string> preloads,
    IReadOnlyList<(string Path, DateTimeOffset? Modified)> sources)
{
    public ReadOnlyMemory<byte> Bytes { get; } = bytes;
    public string ETag { get; } = etag;
    public IReadOnlyList<string> Preloads { get; } = preloads;

    // One stat per file (about 80): cheap beside sending the page, and no file watcher to go stale.
    internal bool IsFresh(IFileProvider webRoot) => sources.All(s => ClientPage.Modified(webRoot, s.Path) == s.Modified);
}
