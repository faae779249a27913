using System.Collections.Concurrent;
using Mosaic.Imaging.Composite;
using Mosaic.Imaging.Display;
using Mosaic.Imaging.Rendering;
using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;

namespace Mosaic.Server.Tiles;

/// <summary>Display settings compiled against a band's field-wide statistics, once per band version and canonical key.</summary>
public sealed class DisplayCompiler(PyramidService pyramids)
{
    private const int MaxCompiledDisplays = 512;
    private readonly ConcurrentDictionary<string, ToneMap> _toneMaps = new(StringComparer.Ordinal);
    private readonly ConcurrentDictionary<string, CompositeMap> _composites = new(StringComparer.Ordinal);

    public ToneMap ToneMapFor(FieldBand band, DisplaySettings display)
    {
        var key = band.Version + "/" + display.CanonicalKey;
        if (_toneMaps.TryGetValue(key, out var toneMap)) return toneMap;
        var summary = pyramids.GetBandSummary(band);
        toneMap = display.Compile(summary.Statistics, summary.Histogram);
        if (_toneMaps.Count >= MaxCompiledDisplays) _toneMaps.Clear();
        return _toneMaps.GetOrAdd(key, toneMap);
    }

    /// <summary>A composite compiled against its three bands' field-wide statistics, once per band versions and canonical key.</summary>
    public CompositeMap CompositeFor(Channels<FieldBand> bands, ICompositeSettings composite)
    {
        ArgumentNullException.ThrowIfNull(composite);
        var key = $"{bands.Red.Version}+{bands.Green.Version}+{bands.Blue.Version}/{composite.CanonicalKey}";
        if (_composites.TryGetValue(key, out var map)) return map;
        map = composite.Compile(ChannelBandsOf(bands));
        if (_composites.Count >= MaxCompiledDisplays) _composites.Clear();
        return _composites.GetOrAdd(key, map);
    }

    /// <summary>Each channel's band statistics (503 while any band is still being prepared).</summary>
    public Channels<ChannelBand> ChannelBandsOf(Channels<FieldBand> bands) => bands.Select(band =>
    {
        var summary = pyramids.GetBandSummary(band);
        return new ChannelBand(summary.Statistics, summary.Histogram);
    });
}
