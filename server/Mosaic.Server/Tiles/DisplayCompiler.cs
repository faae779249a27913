using Mosaic.Imaging.Composite;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Rendering;
using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;

namespace Mosaic.Server.Tiles;

/// <summary>
/// Display settings compiled against a band's field-wide statistics, once per band version and canonical key, kept
/// within a bound in bytes (<see cref="DefaultCapacityBytes"/> for tone maps and composites together).
/// </summary>
public sealed class DisplayCompiler
{
    /// <summary>
    /// 32 MiB: about 480 gray or colour displays at the usual 64 Ki-entry table (65,540 bytes each), or 30 of the
    /// largest (a 1 Mi-entry table, as histogram equalisation can need).
    /// </summary>
    public const long DefaultCapacityBytes = 32L << 20;

    // A composite with its own formula (not three tone maps) holds a few numbers and its palette at most.
    private const long FormulaCompositeBytes = 1024;

    private readonly PyramidService _pyramids;
    private readonly CompiledDisplayCache<object> _compiled;

    public DisplayCompiler(PyramidService pyramids) : this(pyramids, DefaultCapacityBytes)
    {
    }

    public DisplayCompiler(PyramidService pyramids, long capacityBytes)
    {
        _pyramids = pyramids ?? throw new ArgumentNullException(nameof(pyramids));
        _compiled = new CompiledDisplayCache<object>(capacityBytes, SizeOf);
    }

    /// <summary>Bytes the compiled displays kept now hold, against <see cref="CapacityBytes"/>.</summary>
    public long CurrentBytes => _compiled.CurrentBytes;

    public long CapacityBytes => _compiled.CapacityBytes;

    public int Count => _compiled.Count;

    public ToneMap ToneMapFor(FieldBand band, DisplaySettings display)
    {
        ArgumentNullException.ThrowIfNull(display);
        return ToneMapFor(band, display, display.CanonicalKey);
    }

    /// <summary>As above with the settings' canonical key already in hand (it costs a few microseconds to build).</summary>
    public ToneMap ToneMapFor(FieldBand band, DisplaySettings display, string canonicalKey)
    {
        ArgumentNullException.ThrowIfNull(band);
        ArgumentNullException.ThrowIfNull(display);
        ArgumentNullException.ThrowIfNull(canonicalKey);
        return (ToneMap)_compiled.GetOrCompile("t/" + band.Version + "/" + canonicalKey, () =>
        {
            var summary = _pyramids.GetBandSummary(band);
            return display.Compile(summary.Statistics, summary.Histogram);
        });
    }

    /// <summary>A composite compiled against its three bands' field-wide statistics, once per band versions and canonical key.</summary>
    public CompositeMap CompositeFor(Channels<FieldBand> bands, ICompositeSettings composite)
    {
        ArgumentNullException.ThrowIfNull(composite);
        var key = $"c/{bands.Red.Version}+{bands.Green.Version}+{bands.Blue.Version}/{composite.CanonicalKey}";
        return (CompositeMap)_compiled.GetOrCompile(key, () => composite.Compile(ChannelBandsOf(bands)));
    }

    /// <summary>Each channel's band statistics (503 while any band is still being prepared).</summary>
    public Channels<ChannelBand> ChannelBandsOf(Channels<FieldBand> bands) => bands.Select(band =>
    {
        var summary = _pyramids.GetBandSummary(band);
        return new ChannelBand(summary.Statistics, summary.Histogram);
    });

    private static long SizeOf(object compiled) => compiled switch
    {
        ToneMap toneMap => toneMap.RetainedBytes,
        PerBandMap perBand => perBand.ToneMaps.Red.RetainedBytes + perBand.ToneMaps.Green.RetainedBytes + perBand.ToneMaps.Blue.RetainedBytes,
        _ => FormulaCompositeBytes,
    };
}
