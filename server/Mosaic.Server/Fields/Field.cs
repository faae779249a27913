namespace Mosaic.Server.Fields;

/// <summary>
/// What a user picks: a FITS file, or a folder of FITS files; either way the image HDUs are chips, grouped into
/// bands by FILTER (see <see cref="FieldNaming.BandName"/>).
/// </summary>
public sealed class Field
{
    private readonly List<FieldBand> _bands = [];

    internal Field(string id, string path, bool isFolder)
    {
        Id = id;
        Path = path;
        IsFolder = isFolder;
    }

    public string Id { get; }

    public string Path { get; }

    public bool IsFolder { get; }

    /// <summary>
    /// Marked by a file ".mosaic-private" in the field's folder, or "{file name}.mosaic-private" beside a single-file
    /// field: then only callers with an access token, or a share token for this field, see it at all.
    /// </summary>
    public bool IsPrivate { get; internal set; }

    /// <summary>The name of the marker file inside a field's folder (a single file's marker is its name plus this).</summary>
    public const string PrivateMarker = ".mosaic-private";

    public IReadOnlyList<FieldBand> Bands => _bands;

    /// <summary>Every file of the field, readable or not, in name order.</summary>
    public IReadOnlyList<FieldFile> Files { get; private set; } = [];

    /// <summary>The files that cannot be shown, with why; the rest of the field is served.</summary>
    public IReadOnlyList<FieldProblem> Problems => Files.Where(f => f.Error is not null).Select(f => new FieldProblem(f.Name, f.Error!)).ToList();

    /// <summary>Why nothing of this field can be shown, or null where at least one band can.</summary>
    public string? Error => _bands.Count == 0
        ? (IsFolder ? "the folder holds no FITS file" : "the file could not be read")
        : _bands.All(b => b.Error is not null) ? string.Join("; ", _bands.Select(b => b.Error)) : null;

    /// <summary>The first band that can be shown.</summary>
    public FieldBand? DefaultBand => _bands.FirstOrDefault(b => b.Error is null);

    internal void Add(FieldBand band) => _bands.Add(band);

    internal void SetFiles(IReadOnlyList<FieldFile> files) => Files = files;

    /// <summary>By name (case-insensitive); the default band when null or empty.</summary>
    public FieldBand ResolveBand(string? band)
    {
        FieldBand? found = string.IsNullOrWhiteSpace(band)
            ? DefaultBand
            : _bands.FirstOrDefault(b => string.Equals(b.Name, band.Trim(), StringComparison.OrdinalIgnoreCase));
        if (found is null)
        {
            if (!string.IsNullOrWhiteSpace(band))
                throw Errors.MosaicRequestException.NotFound("Band", $"Field '{Id}' has no band '{band}'; it has: {string.Join(", ", _bands.Select(b => b.Name))}.", "band");
            throw new Errors.MosaicRequestException(StatusCodes.Status422UnprocessableEntity, "Unreadable field", $"Field '{Id}' cannot be shown: {Error}");
        }
        if (found.Error is not null)
            throw new Errors.MosaicRequestException(StatusCodes.Status422UnprocessableEntity, "Unreadable band", $"Band '{found.Name}' of field '{Id}' cannot be shown: {found.Error}", "band");
        return found;
    }
}
