using Mosaic.Fits;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Pyramids;

/// <summary>Streams a plane once, writing every reduced level and the histogram to a folder.</summary>
public static class PyramidBuilder
{
    /// <summary>
    /// Builds into a temporary sibling folder and renames it to <paramref name="directory"/> when complete, so a
    /// partial build is never used; an existing folder there is replaced. Progress goes from 0 to 1. On failure or
    /// cancellation the temporary folder is deleted and the exception (OperationCanceledException) propagates.
    /// </summary>
    public static void Build(ImagePlane plane, string directory, IProgress<double>? progress, CancellationToken cancellationToken) =>
        Build(plane, directory, PyramidBuildOptions.Default, progress, cancellationToken);

    /// <summary>As <see cref="Build(ImagePlane, string, IProgress{double}?, CancellationToken)"/>, with the native level stored too where <paramref name="options"/> asks.</summary>
    public static void Build(ImagePlane plane, string directory, PyramidBuildOptions options, IProgress<double>? progress, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(plane);
        Build(new PlaneRowSource(plane), plane.BitPix, directory, options, progress, cancellationToken);
    }

    internal static void Build(IRowSource source, int sourceBitPix, string directory, PyramidBuildOptions options, IProgress<double>? progress, CancellationToken cancellationToken)
    {
        ArgumentNullException.ThrowIfNull(source);
        ArgumentNullException.ThrowIfNull(options);
        ArgumentException.ThrowIfNullOrWhiteSpace(directory);
        var target = Path.TrimEndingDirectorySeparator(Path.GetFullPath(directory));
        var parent = Path.GetDirectoryName(target) ?? throw new ArgumentException($"{directory} has no parent folder to build beside", nameof(directory));
        var name = Path.GetFileName(target);
        Directory.CreateDirectory(parent);
        var temporary = Path.Combine(parent, $".{name}.building-{Guid.NewGuid():N}");
        Directory.CreateDirectory(temporary);
        try
        {
            progress?.Report(0);
            var histogram = PyramidPass.Run(source, temporary, options.StoreNative, progress, cancellationToken);
            using (var stream = new FileStream(Path.Combine(temporary, PyramidLayout.HistogramFile), FileMode.CreateNew, FileAccess.Write))
                histogram.Save(stream);
            var geometry = new PyramidGeometry(source.Width, source.Height);
            new PyramidManifest(PyramidManifest.CurrentVersion, source.Width, source.Height, geometry.MaxZoom, sourceBitPix,
                BandStatistics.From(histogram), options.StoreNative).Write(Path.Combine(temporary, PyramidLayout.ManifestFile));
            cancellationToken.ThrowIfCancellationRequested();
            MoveIntoPlace(temporary, target);
        }
        catch
        {
            TryDelete(temporary);
            throw;
        }
        progress?.Report(1);
    }

    private static void MoveIntoPlace(string temporary, string target)
    {
        if (!Directory.Exists(target))
        {
            Directory.Move(temporary, target);
            return;
        }
        // Set the old folder aside first, so the target name always holds a complete build or nothing.
        var old = Path.Combine(Path.GetDirectoryName(target)!, $".{Path.GetFileName(target)}.replaced-{Guid.NewGuid():N}");
        Directory.Move(target, old);
        try
        {
            Directory.Move(temporary, target);
        }
        catch
        {
            Directory.Move(old, target);
            throw;
        }
        TryDelete(old);
    }

    private static void TryDelete(string folder)
    {
        try
        {
            if (Directory.Exists(folder)) Directory.Delete(folder, recursive: true);
        }
        catch (IOException) { }
        catch (UnauthorizedAccessException) { }
    }
}
