namespace Mosaic.Server.Fields;

/// <summary>The documented rules that turn file and folder names into field, band and chip names.</summary>
public static class FieldNaming
{
    // Longest first, so "x.fits.fz" loses both endings.
    private static readonly string[] FitsEndings = [".fits.fz", ".fit.fz", ".fts.fz", ".fits", ".fit", ".fts", ".fz"];

    private static readonly char[] Separators = ['_', '-', '.'];

    public static bool IsFitsFile(string fileName) =>
        !fileName.StartsWith('.') && FitsEndings.Any(e => fileName.EndsWith(e, StringComparison.OrdinalIgnoreCase));

    /// <summary>The file name without its FITS endings: "deep_r.fits.fz" → "deep_r".</summary>
    public static string Stem(string fileName)
    {
        ArgumentNullException.ThrowIfNull(fileName);
        foreach (var ending in FitsEndings)
            if (fileName.EndsWith(ending, StringComparison.OrdinalIgnoreCase))
                return fileName[..^ending.Length];
        return fileName;
    }

    /// <summary>
    /// The band of an image HDU: its own FILTER, else the primary header's, else the file-name rule
    /// (<see cref="FileBandName"/>). FILTER is kept as written, trimmed.
    /// </summary>
    public static string BandName(string? hduFilter, string? primaryFilter, string fileName, string? folderName)
    {
        if (!string.IsNullOrWhiteSpace(hduFilter)) return hduFilter.Trim();
        if (!string.IsNullOrWhiteSpace(primaryFilter)) return primaryFilter.Trim();
        return FileBandName(fileName, folderName);
    }

    /// <summary>
    /// A file's band without FILTER. In a folder: the stem with the folder's name and one separator taken off the
    /// front, then the text after its last separator ('_', '-' or '.') where there is one, else all of it:
    /// "deep/deep_r.fits" → "r", "cam/c01_r.fits" → "r", "deep/red.fits" → "red". A file that is a field of its own
    /// (<paramref name="folderName"/> null) names its band by its stem.
    /// </summary>
    public static string FileBandName(string fileName, string? folderName)
    {
        var stem = Stem(fileName);
        if (folderName is null) return stem;
        if (folderName.Length > 0 && stem.Length > folderName.Length + 1 && stem.StartsWith(folderName, StringComparison.OrdinalIgnoreCase)
            && Separators.Contains(stem[folderName.Length]))
            stem = stem[(folderName.Length + 1)..];
        var last = stem.LastIndexOfAny(Separators);
        return last >= 0 && last < stem.Length - 1 ? stem[(last + 1)..] : stem;
    }

    /// <summary>An HDU's own name: EXTNAME where present, else "PRIMARY" or "HDU n".</summary>
    public static string HduName(string? extName, int fitsIndex) =>
        extName is { Length: > 0 } name ? name : fitsIndex == 0 ? "PRIMARY" : $"HDU {fitsIndex}";

    /// <summary>
    /// A chip's name in a band made of several files: its EXTNAME where no other chip of the band has it, else the
    /// file's stem where the file gives the band this one image, else "stem[EXTNAME]" or "stem[HDU index]".
    /// </summary>
    public static string ChipName(string? extName, bool extNameUnique, string fileStem, bool onlyImageOfFile, int fitsIndex)
    {
        if (extName is { Length: > 0 } && extNameUnique) return extName;
        if (onlyImageOfFile) return fileStem;
        return extName is { Length: > 0 } ? $"{fileStem}[{extName}]" : $"{fileStem}[{fitsIndex}]";
    }
}
