using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Rendering;

namespace Mosaic.Imaging.Composite;

/// <summary>
/// Each channel through its own display: limits resolved against that channel's band, its stretch, then t × scale
/// clipped to [0, 1] and shown as round(255 t) (the gray palette's levels). Only limits and stretch of each
/// display count: the palette must be gray and the masked colour is the composite's.
/// </summary>
public sealed record PerBandSettings : ICompositeSettings
{
    public const string ModeName = "each";

    /// <summary>Format tag at the head of <see cref="CanonicalKey"/>: bump it when the meaning of a key changes.</summary>
    private const string KeyVersion = "e1";

    private static readonly GrayPalette Gray = new();

    public PerBandSettings(Channels<DisplaySettings> displays, Channels<double>? scale = null, MaskedColor? masked = null)
    {
        foreach (var display in displays.AsEnumerable())
        {
            ArgumentNullException.ThrowIfNull(display, nameof(displays));
            if (!display.Palette.IsGray || display.Palette is not GrayPalette)
                throw new ArgumentException($"a colour composite maps each channel to its own colour: palette '{display.Palette.Name}' cannot apply", "palette");
        }
        Displays = displays;
        Scale = ChannelWeights.Positive(scale ?? ChannelWeights.Ones, nameof(scale));
        Masked = masked ?? MaskedColor.Transparent;
    }

    public string Mode => ModeName;

    public Channels<DisplaySettings> Displays { get; }

    public Channels<double> Scale { get; }

    public MaskedColor Masked { get; }

    public string CanonicalKey =>
        $"{KeyVersion}:{Channel(Displays.Red)}|{Channel(Displays.Green)}|{Channel(Displays.Blue)};scale={ChannelWeights.Key(Scale)};masked={Masked.CanonicalKey}";

    public CompositeMap Compile(Channels<ChannelBand> bands)
    {
        var maps = new ToneMap[Channels<double>.Count];
        for (var c = 0; c < maps.Length; c++)
        {
            var (limits, curve) = ResolveChannel(Displays[c], bands[c]);
            IStretchCurve scaled = Scale[c] == 1 ? curve : new ScaledCurve(curve, Scale[c]);
            maps[c] = ToneMap.Create(limits, scaled, Gray, Masked);
        }
        return new PerBandMap(new Channels<ToneMap>(maps[0], maps[1], maps[2]), Masked);
    }

    public ResolvedComposite Resolve(Channels<ChannelBand> bands)
    {
        var resolved = new ResolvedDisplay[Channels<double>.Count];
        for (var c = 0; c < resolved.Length; c++)
        {
            var (limits, curve) = ResolveChannel(Displays[c], bands[c]);
            resolved[c] = new ResolvedDisplay(Channel(Displays[c]), limits, curve, Gray, Masked);
        }
        return new ResolvedComposite(Mode, CanonicalKey, Masked, Scale, null, new Channels<ResolvedDisplay>(resolved[0], resolved[1], resolved[2]));
    }

    private static (ValueRange Limits, IStretchCurve Curve) ResolveChannel(DisplaySettings display, ChannelBand band)
    {
        var limits = display.Limits.Resolve(band.Statistics, band.Histogram);
        return (limits, display.Stretch.Resolve(new StretchContext(limits, band.Statistics, band.Histogram)));
    }

    private static string Channel(DisplaySettings display) => $"{display.Limits.CanonicalKey};{display.Stretch.CanonicalKey}";
}
