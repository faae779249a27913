using Mosaic.Imaging.Pyramids;
using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;

namespace Mosaic.Server.Regions;

/// <summary>
/// Statistics of a pixel box. Up to <see cref="MaxExactPixels"/> pixels the box's own native pixels are sorted
/// (exact); a larger box is read from the finest reduced level that brings it under that size (means of
/// 2^k x 2^k blocks, so approximate). Field-wide statistics come from the band's histogram.
/// </summary>
public sealed class RegionStatisticsService(PyramidService pyramids)
{
    /// <summary>16 megapixels: 64 MB of floats, the most one request may hold for sorting.</summary>
    public const long MaxExactPixels = 16_000_000;

    public PixelStatistics ForBox(FieldHdu hdu, PixelBox box) => ForBox(hdu, box, MaxExactPixels);

    /// <summary>As <see cref="ForBox(FieldHdu, PixelBox)"/> with another exact-size limit (tests take the reduced-level path on small data).</summary>
    internal PixelStatistics ForBox(FieldHdu hdu, PixelBox box, long maxExactPixels)
    {
        var plane = hdu.Plane;
        if (!box.FitsInside(plane.Width, plane.Height))
            throw new ArgumentOutOfRangeException(nameof(box), box, $"the box runs past the {plane.Width} x {plane.Height} image");
        // An image of one tile has no reduced level: its pixels are few enough to sort whatever the limit.
        if (box.PixelCount <= maxExactPixels || hdu.Geometry.MaxZoom == 0)
        {
            var buffer = GC.AllocateUninitializedArray<float>((int)box.PixelCount);
            NativeBox.ReadRows(pyramids, hdu, box, 0, buffer);
            var kept = KeepFinite(buffer);
            return SortedSample.Describe(buffer.AsSpan(0, kept), buffer.Length - kept, exact: true, level: null);
        }
        return FromLevel(pyramids.GetReady(hdu), box, maxExactPixels);
    }

    /// <summary>The band's statistics over all its HDUs, from the merged histogram (values within one histogram bin).</summary>
    public PixelStatistics ForBand(FieldBand band)
    {
        var summary = pyramids.GetBandSummary(band);
        var statistics = summary.Statistics;
        var percentiles = ReportedPercentiles.Values.Select(p => summary.Histogram.FiniteCount == 0 ? double.NaN : summary.Histogram.Quantile(p / 100)).ToArray();
        return new PixelStatistics(statistics.Count, statistics.Masked, statistics.Min, statistics.Max, statistics.Mean,
            statistics.Median, statistics.MadSigma, percentiles, Exact: false, Level: null);
    }

    private static PixelStatistics FromLevel(Pyramid pyramid, PixelBox box, long maxPixels)
    {
        var geometry = pyramid.Geometry;
        // Top-anchored native rows of the box: FITS y1 is nearest the top.
        int top = geometry.Height - box.Y1, bottom = geometry.Height - box.Y0;
        var z = geometry.MaxZoom - 1;
        while (z > 0 && LevelBox(geometry, z, box, top, bottom) is var b && (long)b.Width * b.Height > maxPixels) z--;
        var (left, first, width, height) = LevelBox(geometry, z, box, top, bottom);
        var buffer = GC.AllocateUninitializedArray<float>(width * height);
        pyramid.ReadRegion(z, left, first, width, height, buffer);
        var kept = KeepFinite(buffer);
        return SortedSample.Describe(buffer.AsSpan(0, kept), buffer.Length - kept, exact: false, level: z);
    }

    private static (int Left, int Top, int Width, int Height) LevelBox(PyramidGeometry geometry, int z, PixelBox box, int top, int bottom)
    {
        var factor = geometry.Factor(z);
        int left = (box.X0 - 1) / factor, first = top / factor;
        return (left, first, (box.X1 - 1) / factor - left + 1, bottom / factor - first + 1);
    }

    /// <summary>Moves the finite values of <paramref name="values"/> to its front, in order; returns how many there are.</summary>
    private static int KeepFinite(Span<float> values)
    {
        var kept = 0;
        for (var i = 0; i < values.Length; i++)
        {
            var v = values[i];
            if (float.IsFinite(v)) values[kept++] = v;
        }
        return kept;
    }
}
