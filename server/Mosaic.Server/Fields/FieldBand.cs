using System.Security.Cryptography;
using System.Text;
using Mosaic.Fits;
using Mosaic.Server.Canvases;

namespace Mosaic.Server.Fields;

/// <summary>
/// One band of a field: the image HDUs (chips) of one or more files that share a band name. Files of the band that
/// cannot be read are kept with their errors; the band is shown from the rest, or carries the errors where none is left.
/// </summary>
public sealed class FieldBand
{
    private readonly List<FieldHdu> _hdus = [];
    private readonly List<FieldFile> _files = [];

    internal FieldBand(Field field, string name)
    {
        Field = field;
        Name = name;
    }

    public Field Field { get; }

    public string Name { get; }

    /// <summary>Every file contributing to the band, readable or not, in name order.</summary>
    public IReadOnlyList<FieldFile> Files => _files;

    public string FilePath => _files[0].Path;

    /// <summary>The first file's name.</summary>
    public string FileName => _files[0].Name;

    /// <summary>True where the band is one file: its chips are then addressed by their FITS HDU index.</summary>
    public bool IsOneFile => _files.Count == 1;

    public string? Error { get; private set; }

    /// <summary>
    /// Short hash that the pyramid cache, display and tile keys carry, changing whenever any file of the band does:
    /// the file's own version for a band that is all of one file, else a hash of the band's name and its files'.
    /// </summary>
    public string Version { get; private set; } = "";

    public IReadOnlyList<FieldHdu> Hdus => _hdus;

    /// <summary>The first chip: HDU 0 where it has data, else the first image extension of the first file.</summary>
    public FieldHdu? DefaultHdu => _hdus.Count > 0 ? _hdus[0] : null;

    /// <summary>
    /// Makes the band from its files (name order) and their images that belong to it (file order). Chips of a
    /// band of one file keep their FITS index and HDU name; of several, they are numbered 0..n-1 and named by
    /// <see cref="FieldNaming.ChipName"/>.
    /// </summary>
    internal void Attach(IReadOnlyList<FieldFile> files, IReadOnlyList<(FieldFile File, Hdu Hdu, ImagePlane Plane)> images)
    {
        _files.AddRange(files);
        if (files.Count == 1)
        {
            foreach (var (file, hdu, plane) in images)
                _hdus.Add(new FieldHdu(this, hdu, plane, hdu.Index, FieldNaming.HduName(hdu.ExtName, hdu.Index), file, canvasFingerprint: null));
        }
        else
        {
            var extNames = images.Select(i => i.Hdu.ExtName).OfType<string>().Where(n => n.Length > 0)
                .GroupBy(n => n, StringComparer.OrdinalIgnoreCase).ToDictionary(g => g.Key, g => g.Count(), StringComparer.OrdinalIgnoreCase);
            var perFile = images.GroupBy(i => i.File).ToDictionary(g => g.Key, g => g.Count());
            for (var i = 0; i < images.Count; i++)
            {
                var (file, hdu, plane) = images[i];
                var extName = hdu.ExtName;
                var unique = extName is { Length: > 0 } && extNames[extName] == 1;
                var name = FieldNaming.ChipName(extName, unique, file.Stem, perFile[file] == 1, hdu.Index);
                _hdus.Add(new FieldHdu(this, hdu, plane, i, name, file, canvasFingerprint: null));
            }
        }
        Version = VersionOf(files, images);
        if (_hdus.Count == 0)
            Error = string.Join("; ", files.Select(f => f.Error ?? $"{f.Name}: no 2-D image of band '{Name}'"));
    }

    private string VersionOf(IReadOnlyList<FieldFile> files, IReadOnlyList<(FieldFile File, Hdu Hdu, ImagePlane Plane)> images)
    {
        var file = files[0];
        // A band that is all of one file keeps the file's version, as links and cached pyramids made before expect.
        if (files.Count == 1 && file.Fits is not null && images.Count == file.Images.Count()) return file.Version;
        if (files.All(f => f.Fits is null)) return "";
        var text = new StringBuilder(Name);
        foreach (var f in files) text.Append('|').Append(f.Path).Append('|').Append(f.Version).Append('|').Append(f.Fingerprint.Length).Append('|').Append(f.Fingerprint.LastWriteUtc.Ticks);
        foreach (var image in images) text.Append('|').Append(image.File.Name).Append('[').Append(image.Hdu.Index).Append(']');
        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())))[..16];
    }

    /// <summary>The band's whole-field canvas (HDU "canvas"), or null where the field needs none or no chip has a WCS.</summary>
    public FieldCanvas? Canvas { get; private set; }

    internal void AttachCanvas(FieldCanvas canvas) => Canvas = canvas;

    /// <summary>
    /// By index ("0", "3": the FITS HDU index in a band of one file, else the chip's place in the band), "canvas"
    /// (the whole-field canvas) or name (case-insensitive); the default HDU when null or empty.
    /// </summary>
    public FieldHdu ResolveHdu(string? hdu)
    {
        if (string.IsNullOrWhiteSpace(hdu))
            return DefaultHdu ?? throw Errors.MosaicRequestException.NotFound("HDU", $"Band '{Name}' of field '{Field.Id}' has no image HDU to show.", "hdu");
        if (string.Equals(hdu.Trim(), FieldCanvas.HduName, StringComparison.OrdinalIgnoreCase))
            return Canvas?.Hdu ?? throw Errors.MosaicRequestException.NotFound("HDU",
                $"Band '{Name}' of field '{Field.Id}' has no whole-field canvas: {(Hdus.Any(h => h.Sky.Wcs is not null) ? "its images share one pixel grid" : "none of its images has a celestial WCS")}.", "hdu");
        if (int.TryParse(hdu, System.Globalization.NumberStyles.None, System.Globalization.CultureInfo.InvariantCulture, out var index))
        {
            if (IsOneFile)
            {
                if (_files[0].Fits is { } fits && index >= fits.Hdus.Count)
                    throw Errors.MosaicRequestException.NotFound("HDU", $"'{FileName}' has {fits.Hdus.Count} HDUs (0 to {fits.Hdus.Count - 1}); there is no HDU {index}.", "hdu");
                return _hdus.FirstOrDefault(h => h.Index == index)
                    ?? throw Errors.MosaicRequestException.NotFound("HDU", $"HDU {index} of '{FileName}' holds no 2-D image of band '{Name}'.", "hdu");
            }
            return index < _hdus.Count ? _hdus[index]
                : throw Errors.MosaicRequestException.NotFound("HDU", $"Band '{Name}' of field '{Field.Id}' has {_hdus.Count} chips (0 to {_hdus.Count - 1}); there is no chip {index}.", "hdu");
        }
        return _hdus.FirstOrDefault(h => string.Equals(h.Name, hdu.Trim(), StringComparison.OrdinalIgnoreCase))
            ?? throw Errors.MosaicRequestException.NotFound("HDU", $"Band '{Name}' of field '{Field.Id}' has no image HDU named '{hdu}'.", "hdu");
    }
}
