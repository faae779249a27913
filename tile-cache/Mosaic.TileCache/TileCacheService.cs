using System.IO.Hashing;
using System.Runtime.InteropServices;
using Microsoft.Extensions.Logging;
using Microsoft.Extensions.Logging.Abstractions;
using Mosaic.TileCache.Disk;
using Mosaic.TileCache.Throttling;

namespace Mosaic.TileCache;

/// <summary>
/// Looks a tile up tier by tier (memory, disk, the shared tier when there is one) and renders it only when none has
/// it, once however many ask at the same moment and within the render queue's bound. A tier that answers fills the
/// tiers above it; a render fills memory and the shared tier. The disk tier takes a tile only once it is asked for
/// a second time (a memory hit, or a render of a key rendered before): most tiles of a new display are asked once,
/// and a file created, written, renamed and later evicted for each is wasted on them. Memory hits answer at once
/// (the one that takes a tile to disk first writes it) and never wait behind renders.
/// </summary>
public sealed class TileCacheService
{
    // Keys rendered but not yet on disk, as 64-bit hashes in a fixed table (a collision only forgets a key, which
    // then reaches the disk at its next render instead): 2^14 slots, 128 KiB.
    private const int AskedOnceSlots = 1 << 14;
    private readonly ulong[] _askedOnce = new ulong[AskedOnceSlots];

    private readonly ITileStore _memory;
    private readonly DiskTileStore? _disk;
    private readonly ISharedTileTier? _shared;
    private readonly RenderQueue _queue;
    private readonly ILogger _logger;
    private readonly SingleFlight<TileLookup> _singleFlight = new();

    public TileCacheService(ITileStore memory, DiskTileStore? disk = null, ISharedTileTier? shared = null, RenderQueue? queue = null,
        ILogger<TileCacheService>? logger = null)
    {
        ArgumentNullException.ThrowIfNull(memory);
        _memory = memory;
        _disk = disk;
        _shared = shared;
        _queue = queue ?? new RenderQueue(new RenderQueueOptions());
        _logger = logger ?? NullLogger<TileCacheService>.Instance;
    }

    /// <summary>
    /// The tile for the key, rendered by <paramref name="render"/> when no tier has it. Throws
    /// <see cref="RenderQueueFullException"/> when it must be rendered and the queue is full. Cancelling stops this
    /// caller's wait only: the shared lookup or render goes on for the others and for the cache.
    /// </summary>
    public ValueTask<TileLookup> GetOrCreateAsync(string key, Func<byte[]> render, CancellationToken cancellationToken = default)
    {
        ArgumentNullException.ThrowIfNull(key);
        ArgumentNullException.ThrowIfNull(render);
        if (_memory.TryGet(key, out var cached))
        {
            if (_disk is not null && TakeAskedOnce(key)) KeepOnDisk(key, cached);
            return ValueTask.FromResult(new TileLookup(cached, TileSource.Memory));
        }
        var flight = _singleFlight.RunAsync(key, () => Task.Run(() => LookUpOrRenderAsync(key, render)));
        return new ValueTask<TileLookup>(cancellationToken.CanBeCanceled ? flight.WaitAsync(cancellationToken) : flight);
    }

    private async Task<TileLookup> LookUpOrRenderAsync(string key, Func<byte[]> render)
    {
        if (_memory.TryGet(key, out var raced)) return new TileLookup(raced, TileSource.Memory);
        if (_disk is not null && await _disk.GetAsync(key).ConfigureAwait(false) is { } fromDisk)
        {
            _memory.Set(key, fromDisk);
            return new TileLookup(fromDisk, TileSource.Disk);
        }
        if (await GetSharedAsync(key).ConfigureAwait(false) is { } fromShared)
        {
            _memory.Set(key, fromShared);
            if (_disk is not null) await _disk.SetAsync(key, fromShared).ConfigureAwait(false);
            return new TileLookup(fromShared, TileSource.Shared);
        }

        var rendered = await _queue.RunAsync(render).ConfigureAwait(false);
        // Memory first: from here on new requests for the key hit it without waiting for the slower tiers.
        _memory.Set(key, rendered);
        if (_disk is not null && RememberAskedOnce(key)) await _disk.SetAsync(key, rendered).ConfigureAwait(false);
        await SetSharedAsync(key, rendered).ConfigureAwait(false);
        return new TileLookup(rendered, TileSource.Rendered);
    }

    /// <summary>True when the key was asked for once before (rendered, not yet on disk); else remembers it and returns false.</summary>
    private bool RememberAskedOnce(string key)
    {
        var hash = HashOf(key);
        ref var slot = ref _askedOnce[(int)(hash & (AskedOnceSlots - 1))];
        if (Interlocked.CompareExchange(ref slot, 0, hash) == hash) return true;
        Volatile.Write(ref slot, hash);
        return false;
    }

    /// <summary>True, once, for a key remembered by <see cref="RememberAskedOnce"/>: it is being asked for again.</summary>
    private bool TakeAskedOnce(string key)
    {
        var hash = HashOf(key);
        ref var slot = ref _askedOnce[(int)(hash & (AskedOnceSlots - 1))];
        return Volatile.Read(ref slot) == hash && Interlocked.CompareExchange(ref slot, 0, hash) == hash;
    }

    // Never 0, which marks an empty slot.
    private static ulong HashOf(string key) => XxHash3.HashToUInt64(MemoryMarshal.AsBytes(key.AsSpan())) | 1;

    // The disk store writes synchronously and reports its own errors; this runs once per tile, on its second ask.
    private void KeepOnDisk(string key, byte[] tile)
    {
        var write = _disk!.SetAsync(key, tile);
        if (!write.IsCompletedSuccessfully) write.AsTask().GetAwaiter().GetResult();
    }

    // The shared tier promises to answer a miss rather than throw; a broken promise must still not fail the request.
    private async ValueTask<byte[]?> GetSharedAsync(string key)
    {
        if (_shared is null) return null;
        try
        {
            return await _shared.GetAsync(key, CancellationToken.None).ConfigureAwait(false);
        }
        catch (Exception e)
        {
            _logger.LogWarning(e, "Shared tile tier failed to read {Key}; answered as a miss", key);
            return null;
        }
    }

    private async ValueTask SetSharedAsync(string key, byte[] bytes)
    {
        if (_shared is null) return;
        try
        {
            await _shared.SetAsync(key, bytes, CancellationToken.None).ConfigureAwait(false);
        }
        catch (Exception e)
        {
            _logger.LogWarning(e, "Shared tile tier failed to keep {Key}; dropped", key);
        }
    }
}
