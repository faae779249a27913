using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Display.Stretches;

/// <summary>What a stretch may depend on: the resolved limits and the band's field-wide statistics.</summary>
public sealed record StretchContext(ValueRange Limits, BandStatistics Statistics, ValueHistogram Histogram);
