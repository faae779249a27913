using Mosaic.Imaging.Composite;
using Mosaic.Server.Composite;
using Mosaic.Server.Endpoints;

namespace Mosaic.Server.Api;

/// <summary>A resolved composite to the JSON the API documents.</summary>
public static class CompositeMapper
{
    public static CompositeDisplayDto ToDto(ResolvedComposite resolved, CompositeTarget target)
    {
        ArgumentNullException.ThrowIfNull(resolved);
        ArgumentNullException.ThrowIfNull(target);
        var bands = new Dictionary<string, string>(StringComparer.Ordinal);
        for (var c = 0; c < 3; c++) bands[ChannelNames.All[c]] = target.Bands[c].Name;
        LuptonDto? lupton = resolved.Lupton is { } l
            ? new LuptonDto(l.Q, l.Range, [.. l.Minimum.AsEnumerable()], LuptonMap.Slope(l.Q))
            : null;
        Dictionary<string, DisplayDto>? channels = null;
        if (resolved.Displays is { } displays)
        {
            channels = new Dictionary<string, DisplayDto>(StringComparer.Ordinal);
            for (var c = 0; c < 3; c++)
                channels[ChannelNames.All[c]] = DisplayMapper.ToDto(displays[c], target.Bands[c].Name, StatisticsEndpoints.BandUnit(target.Bands[c]));
        }
        return new CompositeDisplayDto(resolved.CanonicalKey, resolved.Mode, bands, target.Hdus.Red.Name,
            [.. resolved.Scale.AsEnumerable()], resolved.Masked.CanonicalKey, lupton, channels);
    }
}
