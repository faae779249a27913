using System.Security.Cryptography;
using System.Text;
using Mosaic.Fits;

namespace Mosaic.Server.Fields;

/// <summary>
/// One FITS file of a field, opened once: its image HDUs become chips of one or more bands. A file that cannot be
/// read keeps its error instead.
/// </summary>
public sealed class FieldFile
{
    private FieldFile(string path, FileFingerprint fingerprint, FitsFile? fits, string? error, string version)
    {
        Path = path;
        Fingerprint = fingerprint;
        Fits = fits;
        Error = error;
        Version = version;
    }

    public string Path { get; }

    public string Name => System.IO.Path.GetFileName(Path);

    /// <summary>The file name without its FITS endings.</summary>
    public string Stem => FieldNaming.Stem(Name);

    internal FileFingerprint Fingerprint { get; }

    /// <summary>The open file, or null where it could not be read.</summary>
    public FitsFile? Fits { get; }

    /// <summary>Why the file cannot be shown: it could not be read, or it holds no 2-D image.</summary>
    public string? Error { get; }

    /// <summary>Short hash of the file's path, size, time and headers: the pyramid keys of its chips carry it.</summary>
    public string Version { get; }

    /// <summary>The file's image HDUs with their planes, in file order; none where it could not be read.</summary>
    public IEnumerable<(Hdu Hdu, ImagePlane Plane)> Images =>
        Fits is null ? [] : Fits.Hdus.Where(h => h.Image is not null).Select(h => (h, h.Image!));

    /// <summary>
    /// Opens the file, or keeps <paramref name="previous"/> (its handle and version) where size and time are
    /// unchanged, so an unchanged file keeps its pyramids.
    /// </summary>
    internal static FieldFile Open(FileInfo file, FieldFile? previous, ILogger logger)
    {
        var fingerprint = FileFingerprint.Of(file);
        if (previous is { Fits: not null } && previous.Fingerprint == fingerprint) return previous;
        string? error;
        try
        {
            var fits = FitsFile.Open(file.FullName);
            var found = new FieldFile(file.FullName, fingerprint, fits, NoImage(fits, file.Name), VersionOf(file, fingerprint, fits));
            if (found.Error is not null) logger.LogWarning("Cannot show {File}: {Error}", file.FullName, found.Error);
            return found;
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
        logger.LogWarning("Cannot read {File}: {Error}", file.FullName, error);
        return new FieldFile(file.FullName, fingerprint, null, error, "");
    }

    private static string? NoImage(FitsFile fits, string name) =>
        fits.Hdus.Any(h => h.Image is not null) ? null
            : fits.Hdus.FirstOrDefault(h => h.ImageProblem is not null)?.ImageProblem ?? $"{name}: no HDU holds a 2-D image";

    private static string VersionOf(FileInfo file, FileFingerprint fingerprint, FitsFile fits)
    {
        var text = new StringBuilder();
        text.Append(file.FullName).Append('|').Append(fingerprint.Length).Append('|').Append(fingerprint.LastWriteUtc.Ticks);
        foreach (var hdu in fits.Hdus)
            foreach (var card in hdu.Header.Cards)
                text.Append('|').Append(card.Keyword).Append('=').Append(card.Value);
        return Convert.ToHexStringLower(SHA256.HashData(Encoding.UTF8.GetBytes(text.ToString())))[..16];
    }
}
