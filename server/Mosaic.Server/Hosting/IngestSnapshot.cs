namespace Mosaic.Server.Hosting;

/// <summary>How far an ingest is: pixels of the pyramids to build this run, and pyramids finished of all.</summary>
internal readonly record struct IngestSnapshot(
    double DonePixels, long TotalPixels, int Finished, int Count, TimeSpan Elapsed, string? Current)
{
    public double Fraction => TotalPixels == 0 ? 1 : Math.Clamp(DonePixels / TotalPixels, 0, 1);

    /// <summary>Pixels per second so far; null until there is enough to go on.</summary>
    public double? Rate => Elapsed.TotalSeconds >= 0.5 && DonePixels > 0 ? DonePixels / Elapsed.TotalSeconds : null;

    public TimeSpan? Remaining => Rate is { } rate ? TimeSpan.FromSeconds((TotalPixels - DonePixels) / rate) : null;
}
