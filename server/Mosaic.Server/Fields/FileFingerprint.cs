namespace Mosaic.Server.Fields;

/// <summary>Size and modification time: when either changes, the file is opened anew and its pyramids rebuilt.</summary>
internal readonly record struct FileFingerprint(long Length, DateTime LastWriteUtc)
{
    public static FileFingerprint Of(FileInfo file) => new(file.Length, file.LastWriteTimeUtc);
}
