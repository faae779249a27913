using Mosaic.Fits;
using Mosaic.Server.Canvases;

namespace Mosaic.Server.Fields;

/// <summary>One file of a field: a band, with its image HDUs. A file that cannot be read keeps its error.</summary>
public sealed class FieldBand
{
    private readonly List<FieldHdu> _hdus = [];

    internal FieldBand(Field field, string name, string filePath, FileFingerprint fingerprint)
    {
        Field = field;
        Name = name;
        FilePath = filePath;
        Fingerprint = fingerprint;
    }

    public Field Field { get; }

    public string Name { get; internal set; }

    public string FilePath { get; }

    public string FileName => Path.GetFileName(FilePath);

    internal FileFingerprint Fingerprint { get; }

    public FitsFile? File { get; private set; }

    public string? Error { get; private set; }

    /// <summary>Short hash of the file's path, size, time and headers: the pyramid cache and tile keys carry it.</summary>
    public string Version { get; private set; } = "";

    public IReadOnlyList<FieldHdu> Hdus => _hdus;

    /// <summary>HDU 0 where it has data, else the first image extension.</summary>
    public FieldHdu? DefaultHdu => _hdus.Count > 0 ? _hdus[0] : null;

    internal void Attach(FitsFile file, string version)
    {
        File = file;
        Version = version;
        foreach (var hdu in file.Hdus)
            if (hdu.Image is { } plane) _hdus.Add(new FieldHdu(this, hdu, plane));
        if (_hdus.Count == 0)
            Error = file.Hdus.FirstOrDefault(h => h.ImageProblem is not null)?.ImageProblem
                ?? $"{FileName}: no HDU holds a 2-D image";
    }

    internal void Fail(string error) => Error = error;

    /// <summary>The band's whole-field canvas (HDU "canvas"), or null where the field needs none or no chip has a WCS.</summary>
    public FieldCanvas? Canvas { get; private set; }

    internal void AttachCanvas(FieldCanvas canvas) => Canvas = canvas;

    /// <summary>
    /// By index ("0", "3"), "canvas" (the whole-field canvas) or EXTNAME (case-insensitive); the default HDU when
    /// null or empty.
    /// </summary>
    public FieldHdu ResolveHdu(string? hdu)
    {
        if (string.IsNullOrWhiteSpace(hdu))
            return DefaultHdu ?? throw Errors.MosaicRequestException.NotFound("HDU", $"'{FileName}' has no image HDU to show.", "hdu");
        if (string.Equals(hdu.Trim(), FieldCanvas.HduName, StringComparison.OrdinalIgnoreCase))
            return Canvas?.Hdu ?? throw Errors.MosaicRequestException.NotFound("HDU",
                $"Band '{Name}' of field '{Field.Id}' has no whole-field canvas: {(Hdus.Any(h => h.Sky.Wcs is not null) ? "its images share one pixel grid" : "none of its images has a celestial WCS")}.", "hdu");
        if (int.TryParse(hdu, System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out var index))
        {
            if (File is not null && index >= File.Hdus.Count)
                throw Errors.MosaicRequestException.NotFound("HDU", $"'{FileName}' has {File.Hdus.Count} HDUs (0 to {File.Hdus.Count - 1}); there is no HDU {index}.", "hdu");
            return _hdus.FirstOrDefault(h => h.Index == index)
                ?? throw Errors.MosaicRequestException.NotFound("HDU", $"HDU {index} of '{FileName}' holds no 2-D image.", "hdu");
        }
        return _hdus.FirstOrDefault(h => string.Equals(h.Name, hdu.Trim(), StringComparison.OrdinalIgnoreCase))
            ?? throw Errors.MosaicRequestException.NotFound("HDU", $"'{FileName}' has no image HDU with EXTNAME '{hdu}'.", "hdu");
    }
}
