using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Composite;

/// <summary>A band's field-wide statistics and histogram: what a composite resolves its defaults and limits against.</summary>
public sealed record ChannelBand
{
    public ChannelBand(BandStatistics statistics, ValueHistogram histogram)
    {
        Statistics = statistics ?? throw new ArgumentNullException(nameof(statistics));
        Histogram = histogram ?? throw new ArgumentNullException(nameof(histogram));
    }

    public BandStatistics Statistics { get; }

    public ValueHistogram Histogram { get; }
}
