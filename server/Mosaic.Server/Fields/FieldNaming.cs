namespace Mosaic.Server.Fields;

/// <summary>The documented rules that turn file and folder names into field and band names.</summary>
public static class FieldNaming
{
    // Longest first, so "x.fits.fz" loses both endings.
    private static readonly string[] FitsEndings = [".fits.fz", ".fit.fz", ".fts.fz", ".fits", ".fit", ".fts", ".fz"];

    public static bool IsFitsFile(string fileName) =>
        !fileName.StartsWith('.') && FitsEndings.Any(e => fileName.EndsWith(e, StringComparison.OrdinalIgnoreCase));

    /// <summary>The file name without its FITS endings: "deep_r.fits.fz" → "deep_r".</summary>
    public static string Stem(string fileName)
    {
        foreach (var ending in FitsEndings)
            if (fileName.EndsWith(ending, StringComparison.OrdinalIgnoreCase))
                return fileName[..^ending.Length];
        return fileName;
    }

    /// <summary>
    /// A band is named by its FILTER keyword (primary header, else the first image HDU that has one); without one,
    /// by the file's stem with the folder's name and a separator taken off the front ("deep/deep_r.fits" → "r").
    /// </summary>
    public static string BandName(string? filter, string fileName, string folderName)
    {
        if (!string.IsNullOrWhiteSpace(filter)) return filter.Trim();
        var stem = Stem(fileName);
        if (stem.Length > folderName.Length + 1 && stem.StartsWith(folderName, StringComparison.OrdinalIgnoreCase)
            && stem[folderName.Length] is '_' or '-' or '.')
            return stem[(folderName.Length + 1)..];
        return stem;
    }
}
