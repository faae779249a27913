using System.Buffers;
using System.Text;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Abstractions;
using Microsoft.Win32.SafeHandles;

namespace Mosaic.TileCache.Disk;

/// <summary>
/// The disk tier: one file per tile under <see cref="DiskTileStoreOptions.Directory"/>, written to a temporary file
/// and renamed into place, bounded in bytes by evicting the least recently used. A disk error is logged and
/// answered as a miss, never thrown: the tile can always be rendered again. Files left by an earlier run are
/// counted in the background from their file times, behind everything used since start.
/// File access is synchronous behind the ValueTask signatures: .NET on Linux serves "asynchronous" regular-file IO
/// as a thread-pool hop around the same blocking call, and callers already run on a pool thread, so the hop would
/// only add scheduling delay to a read of a few tens of kilobytes, mostly from the page cache.
/// </summary>
public sealed class DiskTileStore
{
    private const long ReportIntervalMilliseconds = 10_000;
    private readonly DiskTileIndex _index = new();
    private readonly ILogger _logger;
    private readonly string _root;
    private readonly DateTime _startedUtc = DateTime.UtcNow;
    private long _errors;
    private long _lastReportTicks = -ReportIntervalMilliseconds;
    private long _unreported;

    public DiskTileStore(DiskTileStoreOptions options, ILogger<DiskTileStore>? logger = null)
    {
        ArgumentNullException.ThrowIfNull(options);
        ArgumentException.ThrowIfNullOrWhiteSpace(options.Directory, nameof(options.Directory));
        ArgumentOutOfRangeException.ThrowIfLessThan(options.CapacityBytes, DiskTileStoreOptions.MinimumCapacityBytes, nameof(options.CapacityBytes));
        CapacityBytes = options.CapacityBytes;
        _root = Path.GetFullPath(options.Directory);
        _logger = logger ?? NullLogger<DiskTileStore>.Instance;
        IndexRebuilt = Task.Run(RebuildIndex);
    }

    public long CapacityBytes { get; }

    /// <summary>Bytes of the tile files counted now (header and key included).</summary>
    public long CurrentBytes => _index.Bytes;

    public int Count => _index.Count;

    /// <summary>Disk errors met so far (each answered as a miss or a dropped write).</summary>
    public long Errors => Interlocked.Read(ref _errors);

    /// <summary>Completes once the files of earlier runs are counted and the bound applied to them.</summary>
    public Task IndexRebuilt { get; }

    /// <summary>Where the key's file is, whether or not it exists.</summary>
    public string PathFor(string key) => PathOfName(DiskTileFile.NameOf(key));

    /// <summary>The tile kept for the key, or null when there is none, it is damaged (then it is removed) or the disk fails.</summary>
    public ValueTask<byte[]?> GetAsync(string key, CancellationToken cancellationToken = default)
    {
        cancellationToken.ThrowIfCancellationRequested();
        return ValueTask.FromResult(Get(key));
    }

    private byte[]? Get(string key)
    {
        ArgumentNullException.ThrowIfNull(key);
        var name = DiskTileFile.NameOf(key);
        var path = PathOfName(name);
        // Most lookups of a new display miss: a stat answers them without the cost of a thrown FileNotFoundException.
        if (!File.Exists(path))
        {
            _index.Remove(name);
            return null;
        }
        SafeFileHandle handle;
        try
        {
            handle = File.OpenHandle(path, FileMode.Open, FileAccess.Read, FileShare.Read | FileShare.Delete);
        }
        catch (Exception e) when (e is FileNotFoundException or DirectoryNotFoundException)
        {
            _index.Remove(name); // evicted by another instance sharing the folder, or deleted by hand
            return null;
        }
        catch (Exception e) when (IsDiskError(e))
        {
            Report(e, "opening", path);
            return null;
        }

        byte[]? tile;
        long length;
        using (handle)
        {
            try
            {
                length = RandomAccess.GetLength(handle);
                tile = ReadTile(handle, length, Encoding.UTF8.GetBytes(key));
            }
            catch (Exception e) when (IsDiskError(e))
            {
                Report(e, "reading", path);
                return null;
            }
        }
        if (tile is null)
        {
            _logger.LogInformation("Tile disk cache: {Path} is damaged or cut short; removed", path);
            _index.Remove(name);
            TryDelete(path);
            return null;
        }
        // A read can re-add a file eviction has just taken (it was open when deleted): apply the bound again.
        _index.Touch(name, length);
        Evict();
        TryMarkUsed(path);
        return tile;
    }

    /// <summary>Keeps the tile for the key, replacing any earlier file atomically; a disk error drops the write.</summary>
    public ValueTask SetAsync(string key, byte[] tile, CancellationToken cancellationToken = default)
    {
        cancellationToken.ThrowIfCancellationRequested();
        Set(key, tile);
        return ValueTask.CompletedTask;
    }

    private void Set(string key, byte[] tile)
    {
        ArgumentNullException.ThrowIfNull(key);
        ArgumentNullException.ThrowIfNull(tile);
        var name = DiskTileFile.NameOf(key);
        var path = PathOfName(name);
        var keyBytes = Encoding.UTF8.GetBytes(key);
        var header = new byte[DiskTileFile.HeaderBytes];
        DiskTileFile.WriteHeader(header, keyBytes.Length, tile);
        var folder = Path.GetDirectoryName(path)!;
        // Unique per write, so two writers of one key never share a temporary file; the rename picks one.
        var temporary = Path.Combine(folder, $"{name}.{Guid.NewGuid():N}{DiskTileFile.TemporaryExtension}");
        var moved = false;
        try
        {
            using (var handle = CreateTemporary(temporary, folder))
                RandomAccess.Write(handle, new ReadOnlyMemory<byte>[] { header, keyBytes, tile }, 0);
            File.Move(temporary, path, overwrite: true);
            moved = true;
        }
        catch (Exception e) when (IsDiskError(e))
        {
            Report(e, "writing", path);
        }
        finally
        {
            if (!moved) TryDelete(temporary);
        }
        if (!moved) return;
        _index.Touch(name, header.Length + keyBytes.Length + (long)tile.Length);
        Evict();
    }

    /// <summary>The sub-folder is made on its first write only, sparing a check on every other write.</summary>
    private static SafeFileHandle CreateTemporary(string temporary, string folder)
    {
        try
        {
            return File.OpenHandle(temporary, FileMode.CreateNew, FileAccess.Write, FileShare.None);
        }
        catch (DirectoryNotFoundException)
        {
            Directory.CreateDirectory(folder);
            return File.OpenHandle(temporary, FileMode.CreateNew, FileAccess.Write, FileShare.None);
        }
    }

    /// <summary>Keys' file names from least to most recently used (what eviction will take first).</summary>
    internal List<string> NamesOldestFirst() => _index.OldestFirst();

    private static byte[]? ReadTile(SafeFileHandle handle, long length, byte[] key)
    {
        var headLength = DiskTileFile.HeaderBytes + key.Length;
        if (length < headLength || length > int.MaxValue) return null;
        var head = ArrayPool<byte>.Shared.Rent(headLength);
        try
        {
            if (ReadFully(handle, head.AsSpan(0, headLength), 0) != headLength) return null;
            if (!DiskTileFile.TryReadHeader(head.AsSpan(0, headLength), key, length, out var tileLength, out var hash)) return null;
            var tile = new byte[tileLength];
            if (ReadFully(handle, tile, headLength) != tileLength) return null;
            return DiskTileFile.HashMatches(tile, hash) ? tile : null;
        }
        finally
        {
            ArrayPool<byte>.Shared.Return(head);
        }
    }

    private static int ReadFully(SafeFileHandle handle, Span<byte> buffer, long offset)
    {
        var total = 0;
        while (total < buffer.Length)
        {
            var read = RandomAccess.Read(handle, buffer[total..], offset + total);
            if (read == 0) break;
            total += read;
        }
        return total;
    }

    private void RebuildIndex()
    {
        try
        {
            Directory.CreateDirectory(_root);
            var found = new List<(string Name, long Bytes, DateTime LastUse)>();
            var walk = new EnumerationOptions { RecurseSubdirectories = true, MaxRecursionDepth = 1, IgnoreInaccessible = true };
            foreach (var file in new DirectoryInfo(_root).EnumerateFiles("*", walk))
            {
                if (file.Name.EndsWith(DiskTileFile.TemporaryExtension, StringComparison.Ordinal))
                {
                    // Left by a run that stopped mid-write; this run's own writes are newer than its start.
                    if (file.LastWriteTimeUtc < _startedUtc) TryDelete(file.FullName);
                    continue;
                }
                if (!DiskTileFile.IsTileName(file.Name) || file.Directory?.Name != file.Name[..2]) continue;
                // Reads mark a file used through its access time; a file never read since written has only its write time.
                var lastUse = file.LastAccessTimeUtc > file.LastWriteTimeUtc ? file.LastAccessTimeUtc : file.LastWriteTimeUtc;
                found.Add((file.Name[..32], file.Length, lastUse));
            }
            found.Sort((a, b) => b.LastUse.CompareTo(a.LastUse));
            _index.AddOlder(found.Select(f => (f.Name, f.Bytes)));
            Evict();
        }
        catch (Exception e) when (IsDiskError(e))
        {
            Report(e, "listing", _root);
        }
    }

    private void Evict()
    {
        foreach (var name in _index.TakeOverflow(CapacityBytes)) TryDelete(PathOfName(name));
    }

    private string PathOfName(string name) => Path.Combine(_root, name[..2], name + DiskTileFile.Extension);

    /// <summary>The access time carries the last use across restarts; failing to set it only costs eviction order.</summary>
    private static void TryMarkUsed(string path)
    {
        try
        {
            File.SetLastAccessTimeUtc(path, DateTime.UtcNow);
        }
        catch (Exception e) when (IsDiskError(e))
        {
        }
    }

    private void TryDelete(string path)
    {
        try
        {
            File.Delete(path);
        }
        catch (Exception e) when (IsDiskError(e))
        {
            Report(e, "deleting", path);
        }
    }

    private static bool IsDiskError(Exception e) => e is IOException or UnauthorizedAccessException or System.Security.SecurityException;

    /// <summary>Counts every error, logs at most one per interval so a full or failing disk cannot flood the log.</summary>
    private void Report(Exception error, string operation, string path)
    {
        Interlocked.Increment(ref _errors);
        var now = Environment.TickCount64;
        var last = Interlocked.Read(ref _lastReportTicks);
        if (now - last < ReportIntervalMilliseconds || Interlocked.CompareExchange(ref _lastReportTicks, now, last) != last)
        {
            Interlocked.Increment(ref _unreported);
            return;
        }
        var skipped = Interlocked.Exchange(ref _unreported, 0);
        _logger.LogWarning(error, "Tile disk cache: {Operation} {Path} failed; answered as a miss ({Skipped} more such errors since the last report)", operation, path, skipped);
    }
}
