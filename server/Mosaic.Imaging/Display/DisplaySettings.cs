using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Rendering;
using Mosaic.Imaging.Statistics;

namespace Mosaic.Imaging.Display;

/// <summary>How a viewer wants values shown: value limits, then a stretch, then a palette. Equal settings compare equal.</summary>
public sealed record DisplaySettings
{
    /// <summary>Format tag at the head of <see cref="CanonicalKey"/>: bump it when the meaning of a key changes so cached tiles are not reused.</summary>
    private const string KeyVersion = "d2";

    /// <summary>Lower limit: this many MAD sigmas under the median, so the sky noise shows as texture above black.</summary>
    public const double DefaultSigmasBelow = 2;

    /// <summary>Upper limit percentile: only the brightest pixels of bright sources clip to white.</summary>
    public const double DefaultUpperPercent = 99.9;

    /// <summary>asinh softening in MAD sigmas: faint structure a few sigma above the sky stays near linear.</summary>
    public const double DefaultSoftSigmas = 3;

    /// <summary>asinh with field-wide limits from the band's histogram: shows a field well without tuning.</summary>
    public static DisplaySettings Default { get; } = new();

    public IValueLimits Limits
    {
        get;
        init => field = value ?? throw new ArgumentNullException(nameof(Limits), "Limits must be given");
    } = new CombinedLimits(new RobustLimits(DefaultSigmasBelow, DefaultSigmasBelow), new PercentileLimits(0, DefaultUpperPercent));

    public IStretch Stretch
    {
        get;
        init => field = value ?? throw new ArgumentNullException(nameof(Stretch), "Stretch must be given");
    } = new AsinhStretch(Softening.Sigmas(DefaultSoftSigmas));

    public IPalette Palette
    {
        get;
        init => field = value ?? throw new ArgumentNullException(nameof(Palette), "Palette must be given");
    } = new GrayPalette();

    /// <summary>How masked pixels are drawn: transparent by default (the client paints its own colour under tiles).</summary>
    public MaskedColor Masked { get; init; } = MaskedColor.Transparent;

    /// <summary>A stable text form, the same for equal settings: part of tile cache keys and ETags. No '/', quote or space.</summary>
    public string CanonicalKey => $"{KeyVersion}:{Limits.CanonicalKey};{Stretch.CanonicalKey};{Palette.CanonicalKey};{Masked.CanonicalKey}";

    /// <summary>Limits resolved against the band's field-wide statistics, compiled for the tile loop.</summary>
    public ToneMap Compile(BandStatistics statistics, ValueHistogram histogram)
    {
        ArgumentNullException.ThrowIfNull(statistics);
        ArgumentNullException.ThrowIfNull(histogram);
        var limits = Limits.Resolve(statistics, histogram);
        var curve = Stretch.Resolve(new StretchContext(limits, statistics, histogram));
        return ToneMap.Create(limits, curve, Palette, Masked);
    }

    /// <summary>The settings resolved for a band without compiling the tile table: limits, stretch parameters, colour bar.</summary>
    public ResolvedDisplay Resolve(BandStatistics statistics, ValueHistogram histogram)
    {
        ArgumentNullException.ThrowIfNull(statistics);
        ArgumentNullException.ThrowIfNull(histogram);
        var limits = Limits.Resolve(statistics, histogram);
        var curve = Stretch.Resolve(new StretchContext(limits, statistics, histogram));
        return new ResolvedDisplay(CanonicalKey, limits, curve, Palette, Masked);
    }
}
