using Microsoft.Extensions.DependencyInjection;
using Mosaic.Server.Fields;
using Mosaic.Server.Regions;

namespace Mosaic.Server.Tests;

public sealed class RegionStatisticsTests(DisplayReference reference) : IClassFixture<DisplayReference>
{
    [Fact]
    public void A_box_too_large_to_sort_is_read_from_the_finest_level_that_fits()
    {
        var hdu = reference.Factory.Services.GetRequiredService<FieldCatalog>().Get("single").ResolveBand(null).ResolveHdu("0");
        var service = reference.Factory.Services.GetRequiredService<RegionStatisticsService>();
        // 180,000 native pixels over a limit of 50,000: zoom 1 (300 x 150 = 45,000) is the finest level under it.
        var statistics = service.ForBox(hdu, new PixelBox(1, 1, 600, 300), maxExactPixels: 50_000);
        Assert.False(statistics.Exact);
        Assert.Equal(1, statistics.Level);

        // numpy (Debian python3-numpy): nanmean of the top-anchored 2 x 2 blocks of astropy's pixels, then the same
        // statistics as for a native box. The level holds float32 means, hence the 1e-6 tolerance.
        var expected = reference.Expected.GetProperty("singleLevel1");
        Assert.Equal(expected.GetProperty("count").GetInt64(), statistics.Count);
        Assert.Equal(expected.GetProperty("masked").GetInt64(), statistics.Masked);
        Assert.Equal(expected.GetProperty("min").GetDouble(), statistics.Min, 1e-6 * 15010);
        Assert.Equal(expected.GetProperty("max").GetDouble(), statistics.Max, 1e-6 * 15010);
        Assert.Equal(expected.GetProperty("mean").GetDouble(), statistics.Mean, 1e-6 * 15010);
        Assert.Equal(expected.GetProperty("median").GetDouble(), statistics.Median, 1e-6 * 15010);
        Assert.Equal(expected.GetProperty("madSigma").GetDouble(), statistics.MadSigma, 1e-4);
        for (var i = 0; i < ReportedPercentiles.Values.Count; i++)
        {
            var key = ReportedPercentiles.Key(ReportedPercentiles.Values[i]);
            Assert.Equal(expected.GetProperty("percentiles").GetProperty(key).GetDouble(), statistics.Percentiles[i], 1e-6 * 15010);
        }
    }

    [Fact]
    public void Small_boxes_are_exact_from_the_native_pixels()
    {
        var hdu = reference.Factory.Services.GetRequiredService<FieldCatalog>().Get("single").ResolveBand(null).ResolveHdu("0");
        var service = reference.Factory.Services.GetRequiredService<RegionStatisticsService>();
        var statistics = service.ForBox(hdu, new PixelBox(15, 5, 30, 14));
        Assert.True(statistics.Exact);
        Assert.Null(statistics.Level);
        // numpy nanmedian over the same box (see DisplayReference.Script).
        Assert.Equal(reference.Expected.GetProperty("singleBox").GetProperty("median").GetDouble(), statistics.Median);
    }
}
