using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Display.Limits;

/// <summary>A rule choosing the shown value range from a band's field-wide statistics (never from one tile, so tiles match at their seams).</summary>
public interface IValueLimits
{
    /// <summary>Stable text for this rule and its parameters.</summary>
    string CanonicalKey { get; }

    /// <summary>Always a usable range: a flat, empty or odd field is repaired rather than refused (see <see cref="FieldLimits"/>).</summary>
    ValueRange Resolve(BandStatistics statistics, ValueHistogram histogram);
}
