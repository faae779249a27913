using System.Security.Cryptography;
using Mosaic.Server.Hosting;

namespace Mosaic.Server.Access;

/// <summary>
/// The 256-bit HMAC key that signs share tokens, in &lt;state dir&gt;/share-key: made on first start, readable by the
/// server's user only (0600), so links keep working across restarts. Deleting the file revokes every link.
/// </summary>
public sealed class ShareKey
{
    public const string FileName = "share-key";

    public const int Length = 32;

    private const UnixFileMode OwnerOnly = UnixFileMode.UserRead | UnixFileMode.UserWrite;

    public ShareKey(MosaicOptions options, ILogger<ShareKey> logger)
    {
        ArgumentNullException.ThrowIfNull(options);
        Directory.CreateDirectory(options.StateDirectory);
        FilePath = Path.Combine(options.StateDirectory, FileName);
        Bytes = LoadOrCreate(FilePath, logger);
    }

    public string FilePath { get; }

    internal byte[] Bytes { get; }

    private static byte[] LoadOrCreate(string path, ILogger logger)
    {
        try
        {
            var fresh = RandomNumberGenerator.GetBytes(Length);
            var create = new FileStreamOptions { Mode = FileMode.CreateNew, Access = FileAccess.Write };
            if (!OperatingSystem.IsWindows()) create.UnixCreateMode = OwnerOnly;
            using (var stream = new FileStream(path, create))
            {
                stream.Write(fresh);
                stream.Flush(flushToDisk: true);
            }
            logger.LogInformation("Made a new share-link key in {Path}", path);
            return fresh;
        }
        catch (IOException) when (File.Exists(path))
        {
            // Made on an earlier start (or by a second instance at the same moment): use it.
        }
        if (!OperatingSystem.IsWindows() && (File.GetUnixFileMode(path) & ~OwnerOnly) != 0)
        {
            File.SetUnixFileMode(path, OwnerOnly);
            logger.LogWarning("The share-link key {Path} was readable by others; its permissions are now 0600", path);
        }
        var bytes = File.ReadAllBytes(path);
        if (bytes.Length != Length)
            throw new AccessOptionException("--state", $"The share-link key '{path}' holds {bytes.Length} bytes, not {Length}; delete it to make a new one (every share link made so far stops working).");
        return bytes;
    }
}
