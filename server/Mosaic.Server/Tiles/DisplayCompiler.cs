using System.Collections.Concurrent;
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

    public ToneMap ToneMapFor(FieldBand band, DisplaySettings display)
    {
        var key = band.Version + "/" + display.CanonicalKey;
        if (_toneMaps.TryGetValue(key, out var toneMap)) return toneMap;
        var summary = pyramids.GetBandSummary(band);
        toneMap = display.Compile(summary.Statistics, summary.Histogram);
        if (_toneMaps.Count >= MaxCompiledDisplays) _toneMaps.Clear();
        return _toneMaps.GetOrAdd(key, toneMap);
    }
}
