namespace Mosaic.Imaging.Display.Stretches;

/// <summary>
/// f(v) = asinh((v - c) / soft), t = (f(v) - f(lo)) / (f(hi) - f(lo)): linear within about soft of the pivot c,
/// logarithmic beyond, so faint sky and bright cores show at once (the asinh form of Lupton et al. 1999/2004).
/// </summary>
public sealed record AsinhStretch : IStretch
{
    public const string StretchName = "asinh";

    /// <summary>Softening, as a share of the shown range, used where a sigma-relative amount comes to 0 (a field with no spread), so it still renders.</summary>
    private const double FallbackSoftShare = 1e-3;

    /// <param name="soft">Softening, &gt; 0, physical or in sigmas.</param>
    /// <param name="pivot">Physical value c where the curve is steepest; null for the lower limit.</param>
    public AsinhStretch(Softening soft, double? pivot = null)
        : this(soft, pivot is { } c ? AsinhPivot.At(c) : AsinhPivot.AtLo)
    {
    }

    public AsinhStretch(Softening soft, AsinhPivot pivot)
    {
        if (soft.IsEmpty) throw new ArgumentOutOfRangeException(nameof(soft), "soft must be > 0");
        Soft = soft;
        Pivot = pivot ?? throw new ArgumentNullException(nameof(pivot), "pivot must be given");
    }

    public Softening Soft { get; }
    public AsinhPivot Pivot { get; }

    public string CanonicalKey => $"asinh({Soft.CanonicalKey},{Pivot.CanonicalKey})";

    public IStretchCurve Resolve(StretchContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var limits = context.Limits;
        var soft = Soft.PhysicalFor(context.Statistics.MadSigma);
        // A sigma-relative softening on a field with no spread (or no pixels) would be 0: fall back to a share of the range.
        if (!(soft > 0) || !double.IsFinite(soft)) soft = limits.Width * FallbackSoftShare;
        return new AsinhCurve(limits.Lo, limits.Hi, soft, Pivot.Resolve(limits, context.Statistics));
    }
}
