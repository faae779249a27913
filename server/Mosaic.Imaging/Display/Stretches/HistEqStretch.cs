namespace Mosaic.Imaging.Display.Stretches;

/// <summary>
/// Histogram equalisation: t = share of the band's finite pixels in [lo, v] among those in [lo, hi], from the
/// field-wide histogram, so every level holds about as many pixels.
/// </summary>
public sealed record HistEqStretch : IStretch
{
    public const string StretchName = "histeq";

    public string CanonicalKey => StretchName;

    public IStretchCurve Resolve(StretchContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        return new HistEqCurve(context.Limits, context.Histogram);
    }
}
