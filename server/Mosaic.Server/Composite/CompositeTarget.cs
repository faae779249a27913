using Mosaic.Imaging.Composite;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;

namespace Mosaic.Server.Composite;

/// <summary>The three HDUs a composite reads: one per channel, the same HDU of each band, on one pixel grid.</summary>
public sealed record CompositeTarget(Channels<FieldHdu> Hdus)
{
    public Channels<FieldBand> Bands => Hdus.Select(h => h.Band);

    /// <summary>
    /// Bands by name (case-insensitive; 400 naming the channel and listing the field's bands), the HDU by index or
    /// EXTNAME in each (the band's first when absent), and 422 where the grids differ.
    /// </summary>
    public static CompositeTarget Resolve(Field field, Channels<string> bandNames, string? hdu)
    {
        ArgumentNullException.ThrowIfNull(field);
        var bands = new FieldBand[3];
        for (var c = 0; c < 3; c++) bands[c] = ResolveBand(field, ChannelNames.All[c], bandNames[c]);
        var hdus = bands.Select(b => b.ResolveHdu(hdu)).ToArray();
        var grids = hdus.Select(PixelGrid.Of).ToArray();
        // The contract compares WCS only where all three bands have a celestial one.
        var compareFrames = grids.All(g => g.Wcs is not null);
        for (var c = 1; c < 3; c++)
            if (grids[0].DifferenceFrom(grids[c], compareFrames) is { } difference)
                throw new MosaicRequestException(StatusCodes.Status422UnprocessableEntity, "Bands on different pixel grids",
                    $"Bands '{bands[0].Name}' ({ChannelNames.Red}) and '{bands[c].Name}' ({ChannelNames.All[c]}) of field '{field.Id}' are on different pixel grids " +
                    $"at {hdus[0].Name}: {difference}. Composing them needs the camera-canvas alignment, which resamples the bands onto one grid.",
                    ChannelNames.All[c]);
        return new CompositeTarget(new Channels<FieldHdu>(hdus[0], hdus[1], hdus[2]));
    }

    private static FieldBand ResolveBand(Field field, string channel, string name)
    {
        var found = field.Bands.FirstOrDefault(b => string.Equals(b.Name, name.Trim(), StringComparison.OrdinalIgnoreCase))
            ?? throw MosaicRequestException.BadParameter(channel,
                $"Field '{field.Id}' has no band '{name}' for {channel}; it has: {string.Join(", ", field.Bands.Select(b => b.Name))}.");
        if (found.Error is not null)
            throw new MosaicRequestException(StatusCodes.Status422UnprocessableEntity, "Unreadable band",
                $"Band '{found.Name}' ({channel}) of field '{field.Id}' cannot be shown: {found.Error}", channel);
        return found;
    }
}
