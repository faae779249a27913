using Mosaic.Imaging.Display;
using Mosaic.Imaging.Rendering;

namespace Mosaic.Imaging.Composite;

/// <summary>Three gray tone maps, one per channel, each within 1 DN of its exact curve.</summary>
public sealed class PerBandMap : CompositeMap
{
    internal PerBandMap(Channels<ToneMap> toneMaps, MaskedColor masked) : base(masked) => ToneMaps = toneMaps;

    public Channels<ToneMap> ToneMaps { get; }

    public override CompositeMap WithMasked(MaskedColor masked) => masked == Masked ? this : new PerBandMap(ToneMaps, masked);

    private protected override void ApplyCore(ReadOnlySpan<float> red, ReadOnlySpan<float> green, ReadOnlySpan<float> blue,
        Span<byte> redLevels, Span<byte> greenLevels, Span<byte> blueLevels)
    {
        ToneMaps.Red.Apply(red, redLevels);
        ToneMaps.Green.Apply(green, greenLevels);
        ToneMaps.Blue.Apply(blue, blueLevels);
    }
}
