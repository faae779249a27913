using Mosaic.Fits;

namespace Mosaic.Imaging.Pyramids;

/// <summary>CONTRACT STUB: streams a plane once, writing every reduced level and the histogram to a folder.</summary>
public static class PyramidBuilder
{
    /// <summary>Builds into a temporary sibling folder and renames it to <paramref name="directory"/> when complete, so a partial build is never used.</summary>
    public static void Build(ImagePlane plane, string directory, IProgress<double>? progress, CancellationToken cancellationToken)
        => throw new NotImplementedException();
}
