namespace Mosaic.Imaging.Statistics;

/// <summary>CONTRACT STUB: summary statistics of a band's finite pixels over the whole field, from its histogram.</summary>
public sealed record BandStatistics(long Count, long Masked, double Min, double Max, double Mean, double Median, double MadSigma)
{
    public static BandStatistics From(ValueHistogram histogram) => throw new NotImplementedException();
}
