using Mosaic.Server.Hosting;

namespace Mosaic.Server.Fields;

/// <summary>
/// The fields of the data folder. Scanned at start and again (at most once a second) when asked, so files that
/// appear, change or go are picked up; an unchanged file keeps its open handle and its pyramids.
/// </summary>
public sealed class FieldCatalog(MosaicOptions options, ILogger<FieldCatalog> logger)
{
    private static readonly TimeSpan RescanInterval = TimeSpan.FromSeconds(1);
    private readonly Lock _gate = new();
    private IReadOnlyList<Field> _fields = [];
    private DateTime _lastScanUtc = DateTime.MinValue;
    private readonly Canvases.CanvasCatalog _canvases = new(logger);

    /// <summary>Raised after a scan with the fields it found (new and unchanged alike).</summary>
    public event Action<IReadOnlyList<Field>>? Scanned;

    public IReadOnlyList<Field> Fields
    {
        get
        {
            RefreshIfStale();
            return _fields;
        }
    }

    public Field Get(string id)
    {
        // A field the caller may not see is not there for them, wherever its id came from.
        if (Access.FieldScope.IsHidden(id)) throw NoSuchField(id);
        var field = Find(id);
        if (field is null)
        {
            lock (_gate) _lastScanUtc = DateTime.MinValue; // a new file may just have landed
            field = Find(id);
        }
        return field ?? throw NoSuchField(id);
    }

    private static Errors.MosaicRequestException NoSuchField(string id) =>
        Errors.MosaicRequestException.NotFound("Field", $"There is no field '{id}'.", "field");

    private Field? Find(string id) => Fields.FirstOrDefault(f => string.Equals(f.Id, id, StringComparison.Ordinal));

    public void RefreshIfStale()
    {
        lock (_gate)
        {
            if (DateTime.UtcNow - _lastScanUtc < RescanInterval) return;
            var fields = Scan(_fields);
            _canvases.Attach(fields);
            _fields = fields;
            _lastScanUtc = DateTime.UtcNow;
        }
        Scanned?.Invoke(_fields);
    }

    private List<Field> Scan(IReadOnlyList<Field> previous)
    {
        var known = previous.SelectMany(f => f.Files).Where(f => f.Fits is not null)
            .GroupBy(f => f.Path, StringComparer.Ordinal).ToDictionary(g => g.Key, g => g.First(), StringComparer.Ordinal);
        var fields = new List<Field>();
        var root = new DirectoryInfo(options.DataDirectory);
        if (!root.Exists)
        {
            logger.LogWarning("Data folder {Folder} does not exist", root.FullName);
            return fields;
        }

        foreach (var entry in root.EnumerateFileSystemInfos().OrderBy(e => e.Name, StringComparer.Ordinal))
        {
            if (entry.Name.StartsWith('.') || !IsInside(entry, root)) continue;
            if (entry is DirectoryInfo folder)
            {
                var field = new Field(folder.Name, folder.FullName, isFolder: true) { IsPrivate = File.Exists(Path.Combine(folder.FullName, Field.PrivateMarker)) };
                var files = folder.EnumerateFiles().Where(f => FieldNaming.IsFitsFile(f.Name) && IsInside(f, root)).OrderBy(f => f.Name, StringComparer.Ordinal)
                    .Select(f => FieldFile.Open(f, known.GetValueOrDefault(f.FullName), logger)).ToList();
                BandGrouping.Group(field, files, folder.Name);
                fields.Add(field);
            }
            else if (entry is FileInfo file && FieldNaming.IsFitsFile(file.Name))
            {
                var field = new Field(FieldNaming.Stem(file.Name), file.FullName, isFolder: false) { IsPrivate = File.Exists(file.FullName + Field.PrivateMarker) };
                BandGrouping.Group(field, [FieldFile.Open(file, known.GetValueOrDefault(file.FullName), logger)], folderName: null);
                fields.Add(field);
            }
        }

        // A file and a folder may reduce to the same id; the first (folders and files in name order) wins.
        return fields.GroupBy(f => f.Id, StringComparer.Ordinal).Select(g => g.First()).ToList();
    }

    private static bool IsInside(FileSystemInfo entry, DirectoryInfo root)
    {
        // A symbolic link may point anywhere: follow it and keep it only if it stays under the data folder.
        if (entry.LinkTarget is null) return true;
        var target = entry.ResolveLinkTarget(returnFinalTarget: true);
        if (target is null || !target.Exists) return false;
        var rootPath = Path.TrimEndingDirectorySeparator(root.FullName) + Path.DirectorySeparatorChar;
        return target.FullName.StartsWith(rootPath, StringComparison.Ordinal);
    }
}
