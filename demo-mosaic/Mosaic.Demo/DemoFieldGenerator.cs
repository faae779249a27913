using System.Runtime.ExceptionServices;
using Mosaic.Demo.Output;
using Mosaic.Demo.Rendering;
using Mosaic.Demo.Scene;

namespace Mosaic.Demo;

/// <summary>
/// Writes the synthetic demo field: one multi-extension FITS file per band, each chip an IMAGE extension. Chips are
/// rendered in parallel (one chip buffer per worker) and written strictly in order, band after band.
/// </summary>
public static class DemoFieldGenerator
{
    /// <summary>Generates the field into options.OutputDirectory and returns the band files in band order.</summary>
    /// <exception cref="ArgumentException">An option is out of range.</exception>
    /// <exception cref="OperationCanceledException">Cancelled; no partial file is left behind.</exception>
    public static IReadOnlyList<string> Generate(DemoFieldOptions options, IProgress<double>? progress = null, CancellationToken ct = default)
    {
        var scene = DemoScene.Build(options);
        var directory = Path.GetFullPath(options.OutputDirectory);
        Directory.CreateDirectory(directory);

        var chips = scene.Chips.Count;
        var bands = options.Bands.Count;
        var total = chips * bands;
        var files = new BandFile?[bands];
        var written = new string[bands];
        var gate = new object();
        var nextItem = -1;
        var nextToWrite = 0;
        var failed = false;
        var workers = Math.Max(1, Math.Min(Environment.ProcessorCount, total));

        void Work()
        {
            var renderer = new ChipRenderer();
            var buffer = GC.AllocateUninitializedArray<float>(options.ChipWidth * options.ChipHeight);
            while (true)
            {
                var item = Interlocked.Increment(ref nextItem);
                if (item >= total) return;
                var band = item / chips;
                var chip = scene.Chips[item % chips];
                renderer.Render(scene, band, chip, buffer, ct);
                lock (gate)
                {
                    // Items are taken in order, so the wait is at most one chip per other worker.
                    while (nextToWrite != item)
                    {
                        if (failed) return;
                        ct.ThrowIfCancellationRequested();
                        Monitor.Wait(gate, 100);
                    }
                    if (chip.Index == 0)
                        files[band] = BandFile.Create(Path.Combine(directory, options.Bands[band].FileName), FieldHeaders.Primary(scene, band));
                    files[band]!.WriteChip(FieldHeaders.Chip(scene, band, chip), chip.Width, chip.Height, buffer);
                    if (chip.Index == chips - 1)
                    {
                        files[band]!.Commit();
                        written[band] = files[band]!.FinalPath;
                        files[band]!.Dispose();
                        files[band] = null;
                    }
                    nextToWrite++;
                    Monitor.PulseAll(gate);
                    progress?.Report((double)nextToWrite / total);
                }
            }
        }

        try
        {
            Parallel.For(0, workers, new ParallelOptions { MaxDegreeOfParallelism = workers }, _ =>
            {
                try
                {
                    Work();
                }
                catch
                {
                    lock (gate)
                    {
                        failed = true;
                        Monitor.PulseAll(gate);
                    }
                    throw;
                }
            });
        }
        catch (AggregateException e)
        {
            var inner = e.Flatten().InnerExceptions;
            var first = inner.FirstOrDefault(x => x is not OperationCanceledException) ?? inner[0];
            ExceptionDispatchInfo.Capture(first).Throw();
        }
        finally
        {
            foreach (var file in files) file?.Dispose();
        }
        return written;
    }

    /// <summary>Whether the folder holds a finished field of the standard bands (the server's test before generating at start).</summary>
    public static bool IsComplete(string directory) => IsComplete(directory, DemoBand.Standard);

    /// <summary>Whether every band file of these options is in place.</summary>
    public static bool IsComplete(DemoFieldOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        return IsComplete(options.OutputDirectory, options.Bands);
    }

    private static bool IsComplete(string directory, IReadOnlyList<DemoBand> bands)
    {
        ArgumentException.ThrowIfNullOrWhiteSpace(directory);
        // Files appear only by rename once whole, so existence means complete.
        return Directory.Exists(directory) && bands.All(b => File.Exists(Path.Combine(directory, b.FileName)));
    }
}
