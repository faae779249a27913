namespace Mosaic.Imaging.Display.Stretches;

/// <summary>
/// f(v) = asinh((v - c) / soft), t = (f(v) - f(lo)) / (f(hi) - f(lo)): linear within about soft of the pivot c,
/// logarithmic beyond, so faint sky and bright cores show at once (the asinh form of Lupton et al. 1999/2004).
/// </summary>
public sealed record AsinhStretch : IStretch
{
    /// <summary>Softening, as a share of the shown range, used where a sigma-relative amount comes to 0 (a field with no spread), so it still renders.</summary>
    private const double FallbackSoftShare = 1e-3;

    /// <param name="soft">Softening, &gt; 0, physical or in sigmas.</param>
    /// <param name="pivot">Physical value c where the curve is steepest; null for the lower limit.</param>
    public AsinhStretch(Softening soft, double? pivot = null)
    {
        if (soft.IsEmpty) throw new ArgumentOutOfRangeException(nameof(soft), "soft must be > 0");
        if (pivot is { } c && (!double.IsFinite(c) || Math.Abs(c) > float.MaxValue))
            throw new ArgumentOutOfRangeException(nameof(pivot), c, "pivot must be finite (within float32 range)");
        Soft = soft;
        Pivot = pivot;
    }

    public Softening Soft { get; }
    public double? Pivot { get; }

    public string CanonicalKey => $"asinh({Soft.CanonicalKey},{(Pivot is { } c ? KeyText.Number(c) : "lo")})";

    public IStretchCurve Resolve(StretchContext context)
    {
        ArgumentNullException.ThrowIfNull(context);
        var limits = context.Limits;
        var soft = Soft.PhysicalFor(context.Statistics.MadSigma);
        // A sigma-relative softening on a field with no spread (or no pixels) would be 0: fall back to a share of the range.
        if (!(soft > 0) || !double.IsFinite(soft)) soft = limits.Width * FallbackSoftShare;
        return new AsinhCurve(limits.Lo, limits.Hi, soft, Pivot ?? limits.Lo);
    }
}
