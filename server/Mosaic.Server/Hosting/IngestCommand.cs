using System.Diagnostics;
using System.Globalization;
using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;

namespace Mosaic.Server.Hosting;

/// <summary>
/// `ingest [--data DIR] [--cache DIR] [--field ID]`: builds ahead of time every pyramid (and histogram) the server
/// would build for the data folder, or for one field, through the server's own catalog and pyramid service, so a
/// later start on the same folders finds them ready. Exit 0 when all are built, 1 when a pyramid failed or there
/// was nothing to ingest, 2 for bad arguments or folders, 130 when interrupted.
/// </summary>
public static class IngestCommand
{
    public const int Succeeded = 0;
    public const int Failed = 1;
    public const int BadArguments = 2;
    public const int Interrupted = 130;

    private static readonly TimeSpan PollInterval = TimeSpan.FromMilliseconds(100);
    private static readonly TimeSpan PlainLineInterval = TimeSpan.FromSeconds(5);

    /// <summary>From the program's command line: a bar when stdout is a terminal, Ctrl+C stops cleanly.</summary>
    public static int Run(string[] args)
    {
        using var interrupt = new CancellationTokenSource();
        ConsoleCancelEventHandler onCancel = (_, e) =>
        {
            e.Cancel = true; // let the builder delete its partial folder before the process ends
            interrupt.Cancel();
        };
        Console.CancelKeyPress += onCancel;
        try
        {
            return Run(args, Console.Out, Console.Error, interactive: !Console.IsOutputRedirected, interrupt.Token);
        }
        finally
        {
            Console.CancelKeyPress -= onCancel;
        }
    }

    public static int Run(IReadOnlyList<string> args, TextWriter output, TextWriter error, bool interactive, CancellationToken cancellationToken)
    {
        var arguments = IngestArguments.Parse(args, out var argumentError);
        if (arguments is null)
        {
            error.WriteLine($"ingest: {argumentError}. Usage: {IngestArguments.Usage}");
            return BadArguments;
        }
        var options = MosaicOptions.FromConfiguration(new ConfigurationBuilder().AddInMemoryCollection(
            new Dictionary<string, string?> { ["data"] = arguments.Data, ["cache"] = arguments.Cache }).Build());
        if (!options.ServesDemo && !Directory.Exists(options.DataDirectory))
        {
            error.WriteLine($"ingest: the data folder {options.DataDirectory} does not exist.");
            return BadArguments;
        }
        try
        {
            Directory.CreateDirectory(options.CacheDirectory);
            if (options.ServesDemo) DemoField.EnsureGenerated(options); // what the server itself would serve without --data
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            error.WriteLine($"ingest: cannot write to {options.CacheDirectory} or {options.DataDirectory}: {e.Message}");
            return BadArguments;
        }

        using var services = new ServiceCollection().AddLogging().AddMosaic(options).BuildServiceProvider();
        var catalog = services.GetRequiredService<FieldCatalog>();
        // The server's pyramid service, but listening to a catalog that never scans: it then knows only the pyramids
        // asked about (GetStatus tracks them), so it builds those, in that order, and nothing of another field.
        using var pyramids = ActivatorUtilities.CreateInstance<PyramidService>(services, ActivatorUtilities.CreateInstance<FieldCatalog>(services));
        catalog.RefreshIfStale();
        var fields = catalog.Fields;
        if (arguments.Field is { } id)
        {
            var chosen = fields.FirstOrDefault(f => string.Equals(f.Id, id, StringComparison.Ordinal));
            if (chosen is null)
            {
                var known = fields.Count == 0 ? "it holds none" : $"it holds: {string.Join(", ", fields.Select(f => f.Id))}";
                error.WriteLine($"ingest: there is no field '{id}' in {options.DataDirectory}; {known}.");
                return BadArguments;
            }
            fields = [chosen];
        }

        output.WriteLine($"Ingesting {Plural(fields.Count, "field")} of {options.DataDirectory} into {options.CacheDirectory}");
        foreach (var field in fields)
            foreach (var problem in field.Problems)
                error.WriteLine($"ingest: skipped {Path.Combine(field.IsFolder ? field.Path : Path.GetDirectoryName(field.Path)!, problem.File)}: {problem.Error}");
        foreach (var band in fields.SelectMany(f => f.Bands).Where(b => b.Canvas is not null))
            foreach (var chip in band.Canvas!.Excluded)
                output.WriteLine($"  note: {band.Field.Id}/{band.Name}/{chip.Name} (HDU {chip.Hdu}) is left off the canvas: {chip.Reason}");
        var targets = fields.SelectMany(IngestTargets.Of).ToList();
        if (targets.Count == 0)
        {
            error.WriteLine($"ingest: nothing to ingest: no readable FITS image in {(arguments.Field is null ? options.DataDirectory : $"field '{arguments.Field}'")}.");
            return Failed;
        }
        return Build(pyramids, targets, new IngestDisplay(output, interactive, PlainLineInterval), output, error, options, cancellationToken);
    }

    private static int Build(PyramidService pyramids, List<FieldHdu> targets, IngestDisplay display, TextWriter output, TextWriter error,
        MosaicOptions options, CancellationToken cancellationToken)
    {
        // Asking queues each (or opens it from the cache), in the service's own order: chips, then canvases.
        var states = targets.Select(t => pyramids.GetStatus(t).State).ToArray();
        var cached = states.Count(s => s == PyramidState.Ready);
        var toBuild = Enumerable.Range(0, targets.Count).Where(i => states[i] != PyramidState.Ready).ToList();
        var totalPixels = toBuild.Sum(i => Pixels(targets[i]));

        var clock = Stopwatch.StartNew();
        var failures = new List<string>();
        if (toBuild.Count > 0)
        {
            display.Update(new IngestSnapshot(0, totalPixels, cached, targets.Count, TimeSpan.Zero, null));
            pyramids.StartAsync(CancellationToken.None).GetAwaiter().GetResult();
        }
        try
        {
            while (toBuild.Count > 0)
            {
                var done = 0.0;
                var finished = cached;
                var current = new List<string>();
                foreach (var i in toBuild)
                {
                    var status = pyramids.GetStatus(targets[i]);
                    if (status.State is PyramidState.Ready or PyramidState.Failed)
                    {
                        finished++;
                        done += Pixels(targets[i]);
                        if (states[i] != status.State) Finished(targets[i], status, display, failures);
                    }
                    else
                    {
                        done += status.Progress * Pixels(targets[i]);
                        if (status.State == PyramidState.Building) current.Add(targets[i].Description);
                    }
                    states[i] = status.State;
                }
                // Two builds can run at once (PyramidService.ConcurrentBuilds): the line names both.
                var snapshot = new IngestSnapshot(done, totalPixels, finished, targets.Count, clock.Elapsed, current.Count == 0 ? null : string.Join(" + ", current));
                if (finished == targets.Count)
                {
                    display.Finish(snapshot with { Current = null });
                    break;
                }
                display.Update(snapshot);
                if (pyramids.ExecuteTask is { IsCompleted: true } task)
                {
                    display.Note("");
                    error.WriteLine($"ingest: the pyramid builder stopped: {task.Exception?.GetBaseException().Message ?? "without an error"}");
                    return Failed;
                }
                if (cancellationToken.WaitHandle.WaitOne(PollInterval))
                {
                    display.Note("");
                    error.WriteLine("ingest: interrupted; the pyramid being built was discarded, the finished ones are kept.");
                    return Interrupted;
                }
            }
        }
        finally
        {
            // After an interruption this cancels the build under way; the builder deletes its partial folder.
            pyramids.StopAsync(CancellationToken.None).GetAwaiter().GetResult();
        }

        var seconds = clock.Elapsed.TotalSeconds;
        var rate = seconds > 0 ? $", {IngestDisplay.Pixels(totalPixels / seconds)}/s" : "";
        var built = toBuild.Count == 0 ? "Nothing to build"
            : $"Built {Plural(toBuild.Count - failures.Count, "pyramid")} ({IngestDisplay.Pixels(totalPixels)}) in {seconds:F1} s{rate}";
        output.WriteLine($"{built}; {cached} already in the cache; peak memory {Mebibytes(PeakMemory.PeakBytes())}.");
        if (failures.Count > 0)
        {
            foreach (var failure in failures) error.WriteLine($"ingest: failed: {failure}");
            return Failed;
        }
        output.WriteLine($"Ready: start the server with --data {options.DataDirectory} --cache {options.CacheDirectory} to use them.");
        return Succeeded;
    }

    private static void Finished(FieldHdu target, PyramidStatus status, IngestDisplay display, List<string> failures)
    {
        if (status.State == PyramidState.Ready)
        {
            var took = status.BuildTime ?? TimeSpan.Zero;
            display.Note(string.Create(CultureInfo.InvariantCulture, $"  ready   {target.Description} ({target.Plane.Width} x {target.Plane.Height}) in {took.TotalSeconds:F2} s"));
            return;
        }
        failures.Add($"{target.Description}: {status.Error}");
        display.Note($"  FAILED  {target.Description}: {status.Error}");
    }

    private static long Pixels(FieldHdu hdu) => (long)hdu.Plane.Width * hdu.Plane.Height;

    private static string Plural(int count, string noun) => count == 1 ? $"1 {noun}" : $"{count} {noun}s";

    private static string Mebibytes(long? bytes) => bytes is { } b ? $"{b / (1024.0 * 1024.0):F0} MiB" : "unknown";
}
