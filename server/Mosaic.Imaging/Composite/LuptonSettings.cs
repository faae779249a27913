using Mosaic.Imaging.Display;

namespace Mosaic.Imaging.Composite;

/// <summary>
/// The colour-preserving asinh composite of Lupton et al. (2004, PASP 116, 133), with the normalisation of
/// astropy.visualization.make_lupton_rgb: per band x_i = (v_i - minimum_i) * scale_i, I = mean of the three,
/// each channel x_i * asinh(Q I / range) * slope / I with slope = 25.5 / asinh(Q / 10) (so an intensity of range / 10
/// shows at 25.5 DN), then where the largest channel passes 255 all three are divided by it (the hue is kept).
/// </summary>
public sealed record LuptonSettings : ICompositeSettings
{
    public const string ModeName = "lupton";

    /// <summary>Format tag at the head of <see cref="CanonicalKey"/>: bump it when the meaning of a key changes.</summary>
    private const string KeyVersion = "l1";

    /// <summary>Softening of Lupton et al. (2004) and astropy's default: a wide range compressed, faint colours still apart.</summary>
    public const double DefaultQ = 8;

    /// <summary>Largest Q, as astropy clamps it: beyond, the stretch no longer changes in float32.</summary>
    public const double MaximumQ = 1e10;

    /// <summary>Smallest Q: float32 machine epsilon, below which the curve is linear to float precision (astropy treats it as 0).</summary>
    public const double MinimumQ = 1.0 / (1 << 23);

    /// <summary>Default range in MAD sigmas (the mean of the three bands'): sky noise a sigma or two up shows dim, not gray.</summary>
    public const double DefaultRangeSigmas = 10;

    /// <summary>Default minimum in MAD sigmas under each band's median: 0, so the sky level is black in every channel.</summary>
    public const double DefaultMinimumSigmas = 0;

    public LuptonSettings(double q = DefaultQ, double? range = null, Channels<double>? minimum = null, Channels<double>? scale = null,
        MaskedColor? masked = null)
    {
        if (!(double.IsFinite(q) && q > 0)) throw new ArgumentOutOfRangeException(nameof(q), q, $"q must be a finite number > 0; got {q}");
        if (q < MinimumQ) throw new ArgumentOutOfRangeException(nameof(q), q, $"q must be at least 2^-23 ({MinimumQ:G3}): below, the stretch is linear to float precision");
        Q = Math.Min(q, MaximumQ);
        if (range is { } r)
        {
            if (!(double.IsFinite(r) && r > 0)) throw new ArgumentOutOfRangeException(nameof(range), r, $"range must be a finite number > 0; got {r}");
            LuptonMap.CheckUsable(Q, r);
        }
        if (minimum is { } m)
            foreach (var value in m.AsEnumerable())
                if (!double.IsFinite(value) || Math.Abs(value) > float.MaxValue)
                    throw new ArgumentOutOfRangeException(nameof(minimum), value, $"min must be finite within float32 range; got {value}");
        Range = range;
        Minimum = minimum;
        Scale = ChannelWeights.Positive(scale ?? ChannelWeights.Ones, nameof(scale));
        Masked = masked ?? MaskedColor.Transparent;
    }

    public string Mode => ModeName;

    public double Q { get; }

    /// <summary>The linear range; null for the default, <see cref="DefaultRangeSigmas"/> times the mean MAD sigma of the bands.</summary>
    public double? Range { get; }

    /// <summary>Each band's value shown as black; null for the default, each band's field-wide median.</summary>
    public Channels<double>? Minimum { get; }

    public Channels<double> Scale { get; }

    public MaskedColor Masked { get; }

    public string CanonicalKey =>
        $"{KeyVersion}:q={ChannelWeights.Number(Q)};range={(Range is { } r ? ChannelWeights.Number(r) : "auto")};" +
        $"min={(Minimum is { } m ? ChannelWeights.Key(m) : "auto")};scale={ChannelWeights.Key(Scale)};masked={Masked.CanonicalKey}";

    /// <summary>Minimum and range filled in from the bands' field-wide statistics.</summary>
    public LuptonParameters ResolveParameters(Channels<ChannelBand> bands)
    {
        var minimum = Minimum ?? bands.Select(b => DefaultMinimum(b));
        var range = Range ?? DefaultRange(bands);
        return new LuptonParameters(Q, range, minimum, Scale);
    }

    public CompositeMap Compile(Channels<ChannelBand> bands) => new LuptonMap(ResolveParameters(bands), Masked);

    public ResolvedComposite Resolve(Channels<ChannelBand> bands) =>
        new(Mode, CanonicalKey, Masked, Scale, ResolveParameters(bands), null);

    private static double DefaultMinimum(ChannelBand band)
    {
        var s = band.Statistics;
        var value = s.Median - DefaultMinimumSigmas * (double.IsFinite(s.MadSigma) ? s.MadSigma : 0);
        // An empty band has no median: its channel then starts at zero.
        return double.IsFinite(value) ? value : 0;
    }

    /// <summary>
    /// <see cref="DefaultRangeSigmas"/> × the mean MAD sigma; a band set without noise (all sigmas 0) falls back to the
    /// mean spread between median and 99.5th percentile, then to 1, so a flat field is repaired rather than refused.
    /// </summary>
    private double DefaultRange(Channels<ChannelBand> bands)
    {
        var sigma = bands.AsEnumerable().Select(b => b.Statistics.MadSigma).Where(double.IsFinite).DefaultIfEmpty(0).Average();
        var range = DefaultRangeSigmas * sigma;
        if (!(range > 0))
            range = bands.AsEnumerable().Select(Spread).Where(double.IsFinite).DefaultIfEmpty(0).Average();
        if (!(range > 0) || !LuptonMap.IsUsable(Q, range)) range = 1;
        return range;

        static double Spread(ChannelBand band) => band.Statistics.Count > 0 ? band.Histogram.Quantile(0.995) - band.Statistics.Median : double.NaN;
    }
}
