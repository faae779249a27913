using System.Security.Cryptography;
using System.Text;
using Mosaic.Fits;
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
        var field = Find(id);
        if (field is null)
        {
            lock (_gate) _lastScanUtc = DateTime.MinValue; // a new file may just have landed
            field = Find(id);
        }
        return field ?? throw Errors.MosaicRequestException.NotFound("Field", $"There is no field '{id}'.", "field");
    }

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
        var known = previous.SelectMany(f => f.Bands).Where(b => b.File is not null)
            .ToDictionary(b => b.FilePath, StringComparer.Ordinal);
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
                var field = new Field(folder.Name, folder.FullName, isFolder: true);
                foreach (var file in folder.EnumerateFiles().Where(f => FieldNaming.IsFitsFile(f.Name) && IsInside(f, root)).OrderBy(f => f.Name, StringComparer.Ordinal))
                    field.Add(OpenBand(field, file, folder.Name, known));
                MakeBandNamesUnique(field);
                fields.Add(field);
            }
            else if (entry is FileInfo file && FieldNaming.IsFitsFile(file.Name))
            {
                var field = new Field(FieldNaming.Stem(file.Name), file.FullName, isFolder: false);
                field.Add(OpenBand(field, file, folderName: "", known));
                fields.Add(field);
            }
        }

        // A file and a folder may reduce to the same id; the first (folders and files in name order) wins.
        return fields.GroupBy(f => f.Id, StringComparer.Ordinal).Select(g => g.First()).ToList();
    }

    private FieldBand OpenBand(Field field, FileInfo file, string folderName, Dictionary<string, FieldBand> known)
    {
        var fingerprint = FileFingerprint.Of(file);
        FitsFile? fits = null;
        string? error = null;
        if (known.TryGetValue(file.FullName, out var before) && before.Fingerprint == fingerprint && before.File is not null)
        {
            fits = before.File;
        }
        else
        {
            try
            {
                fits = FitsFile.Open(file.FullName);
            }
            catch (FitsFormatException e)
            {
                error = e.Message;
            }
            catch (IOException e)
            {
                error = $"{file.Name}: {e.Message}";
            }
            catch (UnauthorizedAccessException)
            {
                error = $"{file.Name}: permission denied";
            }
            if (error is not null) logger.LogWarning("Cannot read {File}: {Error}", file.FullName, error);
        }

        var filter = fits is null ? null : FindFilter(fits);
        var band = new FieldBand(field, FieldNaming.BandName(filter, file.Name, folderName), file.FullName, fingerprint);
        if (fits is not null) band.Attach(fits, Version(file, fingerprint, fits));
        else band.Fail(error!);
        return band;
    }

    private static string? FindFilter(FitsFile fits)
    {
        foreach (var hdu in fits.Hdus)
        {
            if (hdu.Header.GetString("FILTER") is { } filter && !string.IsNullOrWhiteSpace(filter)) return filter;
            if (hdu.Image is not null && hdu.Index > 0) break;
        }
        return null;
    }

    private static void MakeBandNamesUnique(Field field)
    {
        foreach (var group in field.Bands.GroupBy(b => b.Name, StringComparer.OrdinalIgnoreCase).Where(g => g.Count() > 1))
            foreach (var band in group)
                band.Name = FieldNaming.Stem(band.FileName);
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

    private static string Version(FileInfo file, FileFingerprint fingerprint, FitsFile fits)
    {
        var text = new StringBuilder();
        text.Append(file.FullName).Append('|').Append(fingerprint.Length).Append('|').Append(fingerprint.LastWriteUtc.Ticks);
        foreach (var hdu in fits.Hdus)
            foreach (var card in hdu.Header.Cards)
                text.Append('|').Append(card.Keyword).Append('=').Append(card.Value);
        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())))[..16];
    }
}
