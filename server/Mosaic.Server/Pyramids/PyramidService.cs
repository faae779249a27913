using System.Collections.Concurrent;
using System.Diagnostics;
using Mosaic.Fits;
using Mosaic.Imaging.Pyramids;
using Mosaic.Imaging.Statistics;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Hosting;

namespace Mosaic.Server.Pyramids;

/// <summary>
/// Builds the pyramid of every image HDU once, in the background, into the cache folder, where a later start finds
/// it; a band's whole-field canvas is built like any HDU, queued after every chip. The HDUs someone is looking at go
/// to the front of the queue.
/// <para>Up to <see cref="ConcurrentBuilds"/> builds run at once (two where there are two cores): each build's pass
/// already uses two threads, but its reads, writes and level cascade leave gaps a second build fills. Memory stays
/// bounded by that count, not by the data: one build holds two native strips (2^19 floats each, 4 MiB), the level
/// writers' strips (2^20 floats in all, 4 MiB), about 12 bytes per image column for the cascade's rows and two dense
/// histograms (8 MiB each); a canvas build adds, per reading thread, one chip rectangle of at most 2^20 floats
/// (4 MiB). So two builds hold at most about 2 x 32 MiB plus 24 bytes per column of the two widest images.</para>
/// </summary>
public sealed class PyramidService : BackgroundService
{
    private static readonly TimeSpan ProgressLogInterval = TimeSpan.FromSeconds(3);

    /// <summary>Builds run at once: two, or one on a single core.</summary>
    public static int ConcurrentBuilds { get; } = Math.Clamp(Environment.ProcessorCount, 1, 2);

    private readonly ConcurrentDictionary<string, PyramidEntry> _entries = new(StringComparer.Ordinal);
    private readonly ConcurrentDictionary<string, BandSummary> _bandSummaries = new(StringComparer.Ordinal);
    private readonly LinkedList<PyramidEntry> _queue = new();
    private readonly Lock _queueGate = new();
    private readonly SemaphoreSlim _work = new(0);
    private readonly MosaicOptions _options;
    private readonly ILogger<PyramidService> _logger;

    public PyramidService(MosaicOptions options, FieldCatalog catalog, ILogger<PyramidService> logger)
    {
        _options = options;
        _logger = logger;
        catalog.Scanned += fields =>
        {
            // The chips first, then the canvases: a canvas reads chip rows, and the field-wide limits its tiles
            // need come from the chips' pyramids.
            var bands = fields.SelectMany(f => f.Bands).ToList();
            var hdus = bands.SelectMany(b => b.Hdus).Concat(bands.Select(b => b.Canvas?.Hdu).OfType<FieldHdu>()).ToList();
            Forget(hdus);
            Track(hdus);
        };
    }

    /// <summary>
    /// Drops what belongs to files that changed or went: their queued builds would be wasted work. The pyramids
    /// are not disposed here, since a request may still be reading one; their handles close when they are collected.
    /// </summary>
    private void Forget(IReadOnlyList<FieldHdu> current)
    {
        var keys = current.Select(h => h.PyramidKey).ToHashSet(StringComparer.Ordinal);
        var versions = current.Select(h => h.Band.Version).ToHashSet(StringComparer.Ordinal);
        foreach (var key in _entries.Keys)
        {
            if (keys.Contains(key) || !_entries.TryGetValue(key, out var stale) || stale.State == PyramidState.Building) continue;
            _entries.TryRemove(key, out _);
            lock (_queueGate) _queue.Remove(stale);
        }
        foreach (var version in _bandSummaries.Keys)
            if (!versions.Contains(version)) _bandSummaries.TryRemove(version, out _);
    }

    private string PyramidRoot => Path.Combine(_options.CacheDirectory, "pyramids");

    public PyramidStatus GetStatus(FieldHdu hdu) => Entry(hdu).Status;

    /// <summary>The built pyramid, or PyramidNotReadyException (after moving the HDU to the front of the queue).</summary>
    public Pyramid GetReady(FieldHdu hdu)
    {
        var entry = Entry(hdu);
        return entry.State switch
        {
            PyramidState.Ready => entry.Pyramid!,
            PyramidState.Failed => throw new MosaicRequestException(StatusCodes.Status422UnprocessableEntity, "Pyramid failed",
                $"The pyramid of {hdu.Description} could not be built: {entry.Error}"),
            _ => throw NotReady(hdu, entry),
        };
    }

    /// <summary>Field-wide statistics of a band: every HDU of the band together, so chips share one set of limits; the chips only, never the resampled canvas.</summary>
    public BandSummary GetBandSummary(FieldBand band)
    {
        if (_bandSummaries.TryGetValue(band.Version, out var summary)) return summary;
        var waiting = band.Hdus.Select(Entry).Where(e => e.State is PyramidState.Queued or PyramidState.Building).ToList();
        if (waiting.Count > 0)
        {
            foreach (var entry in Enumerable.Reverse(waiting)) Prioritise(entry);
            var progress = band.Hdus.Average(h => Entry(h).Status.Progress);
            throw new PyramidNotReadyException(
                $"Band '{band.Name}' of field '{band.Field.Id}' is being prepared: {band.Hdus.Count - waiting.Count} of {band.Hdus.Count} HDUs ready ({progress:P0}); try again shortly.",
                progress);
        }
        var histogram = new ValueHistogram();
        foreach (var hdu in band.Hdus) histogram.Merge(GetReady(hdu).Histogram);
        summary = new BandSummary(histogram, BandStatistics.From(histogram));
        return _bandSummaries.GetOrAdd(band.Version, summary);
    }

    private PyramidNotReadyException NotReady(FieldHdu hdu, PyramidEntry entry)
    {
        Prioritise(entry);
        var status = entry.State == PyramidState.Building ? $"being built ({entry.Progress:P0})" : "queued";
        return new PyramidNotReadyException($"The pyramid of {hdu.Description} is {status}; try again shortly.", entry.Progress);
    }

    private PyramidEntry Entry(FieldHdu hdu)
    {
        if (_entries.TryGetValue(hdu.PyramidKey, out var entry)) return entry;
        Track([hdu]);
        return _entries[hdu.PyramidKey];
    }

    private void Track(IEnumerable<FieldHdu> hdus)
    {
        foreach (var hdu in hdus)
        {
            var created = false;
            var entry = _entries.GetOrAdd(hdu.PyramidKey, _ => { created = true; return new PyramidEntry(hdu); });
            if (!created) continue;
            if (TryOpenExisting(entry)) continue;
            lock (_queueGate) _queue.AddLast(entry);
            _work.Release();
        }
    }

    private void Prioritise(PyramidEntry entry)
    {
        lock (_queueGate)
        {
            var node = _queue.Find(entry);
            if (node is null || node == _queue.First) return;
            _queue.Remove(node);
            _queue.AddFirst(node);
        }
    }

    private string DirectoryOf(FieldHdu hdu) => Path.Combine(PyramidRoot, hdu.PyramidKey);

    private bool TryOpenExisting(PyramidEntry entry)
    {
        var directory = DirectoryOf(entry.Hdu);
        if (!Directory.Exists(directory)) return false;
        try
        {
            var pyramid = Pyramid.Open(directory, entry.Hdu.Plane);
            if (entry.Hdu.IsCanvas && !pyramid.StoresNative)
            {
                // Built before canvases stored their native level: reading it would resample the chips per tile.
                pyramid.Dispose();
                throw new InvalidDataException("the canvas pyramid does not store its native level");
            }
            entry.Pyramid = pyramid;
            entry.State = PyramidState.Ready;
            return true;
        }
        catch (InvalidDataException e)
        {
            _logger.LogWarning("Rebuilding the pyramid of {Hdu}: the cached one is unusable ({Reason})", entry.Hdu.Description, e.Message);
            Directory.Delete(directory, recursive: true);
            return false;
        }
    }

    protected override async Task ExecuteAsync(CancellationToken stoppingToken)
    {
        Directory.CreateDirectory(PyramidRoot);
        // Builds are CPU-bound and long: keep them off the request thread pool.
        var loops = Enumerable.Range(0, ConcurrentBuilds)
            .Select(_ => Task.Factory.StartNew(() => BuildLoop(stoppingToken), stoppingToken, TaskCreationOptions.LongRunning, TaskScheduler.Default).Unwrap());
        await Task.WhenAll(loops);
    }

    private async Task BuildLoop(CancellationToken stoppingToken)
    {
        while (!stoppingToken.IsCancellationRequested)
        {
            try
            {
                await _work.WaitAsync(stoppingToken);
            }
            catch (OperationCanceledException)
            {
                return;
            }
            PyramidEntry? entry = null;
            var waiting = false;
            lock (_queueGate)
            {
                for (var node = _queue.First; node is not null; node = node.Next)
                {
                    if (ChipsPending(node.Value.Hdu)) { waiting = true; continue; }
                    entry = node.Value;
                    _queue.Remove(node);
                    break;
                }
            }
            if (entry is not null) Build(entry, stoppingToken);
            else if (waiting)
            {
                // Only canvases whose chips the other build is still making: keep the work counted, look again soon.
                _work.Release();
                try
                {
                    await Task.Delay(CanvasWaitInterval, stoppingToken);
                }
                catch (OperationCanceledException)
                {
                    return;
                }
            }
        }
    }

    private static readonly TimeSpan CanvasWaitInterval = TimeSpan.FromMilliseconds(50);

    // A canvas starts once its band's chips are built, as it was queued: with two builds at once the other may still
    // be making the last chip, whose field-wide limits the canvas's tiles need. Taking the next entry meanwhile
    // (never waiting on a canvas while holding a build) keeps both builds busy and can never deadlock.
    private bool ChipsPending(FieldHdu hdu) => hdu.IsCanvas && hdu.Band.Hdus.Any(chip =>
        _entries.TryGetValue(chip.PyramidKey, out var e) && e.State is PyramidState.Queued or PyramidState.Building);

    private void Build(PyramidEntry entry, CancellationToken stoppingToken)
    {
        var hdu = entry.Hdu;
        var directory = DirectoryOf(hdu);
        entry.State = PyramidState.Building;
        var megapixels = (double)hdu.Plane.Width * hdu.Plane.Height / 1e6;
        _logger.LogInformation("Building the pyramid of {Hdu} ({Width} x {Height}, {Megapixels:F1} Mpx)", hdu.Description, hdu.Plane.Width, hdu.Plane.Height, megapixels);
        var clock = Stopwatch.StartNew();
        var lastLogged = TimeSpan.Zero;
        var progress = new SynchronousProgress(p =>
        {
            entry.Progress = p;
            // A line every few seconds for the long builds; the short ones only say when they are done.
            if (clock.Elapsed - lastLogged >= ProgressLogInterval && p < 1)
            {
                lastLogged = clock.Elapsed;
                _logger.LogInformation("Pyramid of {Hdu}: {Progress:P0}", hdu.Description, p);
            }
        });
        try
        {
            if (Directory.Exists(directory)) Directory.Delete(directory, recursive: true);
            PyramidBuilder.Build(hdu.Plane, directory, BuildOptions(hdu), progress, stoppingToken);
            entry.Pyramid = Pyramid.Open(directory, hdu.Plane);
            entry.BuildTime = clock.Elapsed;
            entry.State = PyramidState.Ready;
            _logger.LogInformation("Pyramid of {Hdu} ready in {Seconds:F2} s ({Rate:F0} Mpx/s)", hdu.Description, clock.Elapsed.TotalSeconds, megapixels / clock.Elapsed.TotalSeconds);
        }
        catch (OperationCanceledException) when (stoppingToken.IsCancellationRequested)
        {
            entry.State = PyramidState.Queued;
        }
        catch (Exception e) when (e is FitsFormatException or IOException or InvalidDataException or UnauthorizedAccessException)
        {
            entry.Error = e.Message;
            entry.State = PyramidState.Failed;
            _logger.LogError("The pyramid of {Hdu} failed: {Error}", hdu.Description, e.Message);
        }
    }

    /// <summary>A canvas is resampled from its chips once, here, and keeps that native level; a chip's plane is read directly.</summary>
    private static PyramidBuildOptions BuildOptions(FieldHdu hdu) => new() { StoreNative = hdu.IsCanvas };

    /// <summary>Progress&lt;T&gt; posts to the thread pool; the builder's reports are cheap enough to take inline.</summary>
    private sealed class SynchronousProgress(Action<double> report) : IProgress<double>
    {
        public void Report(double value) => report(value);
    }
}
