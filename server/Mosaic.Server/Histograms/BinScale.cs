namespace Mosaic.Server.Histograms;

/// <summary>How the bin edges of a histogram are spaced between lo and hi.</summary>
public enum BinScale
{
    /// <summary>Equal widths in value.</summary>
    Linear,

    /// <summary>Equal widths in log(value): needs 0 &lt; lo.</summary>
    Log,
}
