using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Sky;
using Mosaic.Wcs.Coordinates;

namespace Mosaic.Server.Endpoints;

/// <summary>The HDU and exact 1-based position a probe asks about.</summary>
public static class ProbeTarget
{
    /// <exception cref="MosaicRequestException">The HDU does not exist (404), or the sky position is on none of the candidates (404, saying why).</exception>
    /// <exception cref="SkyUnavailableException">The HDU (or every HDU of the band) has no celestial WCS.</exception>
    public static (FieldHdu Hdu, double X, double Y) Resolve(FieldBand band, string? hdu, ProbeQuery query)
    {
        ArgumentNullException.ThrowIfNull(band);
        ArgumentNullException.ThrowIfNull(query);
        return query.Sky is { } sky ? Locate(band, hdu, sky, query.SkyParameter!) : (band.ResolveHdu(hdu), query.X, query.Y);
    }

    /// <summary>The HDU holding a sky position: the one named, or any of the band's.</summary>
    private static (FieldHdu Hdu, double X, double Y) Locate(FieldBand band, string? hdu, SkyPosition sky, string parameter)
    {
        var named = string.IsNullOrWhiteSpace(hdu) ? null : band.ResolveHdu(hdu);
        IReadOnlyList<FieldHdu> candidates = named is null ? band.Hdus : [named];
        if (named is { Sky.Wcs: null })
            throw new SkyUnavailableException($"HDU {named.Name} of band '{band.Name}' has no sky coordinates: {named.Sky.Error}.", named.Sky.Error, "hdu");
        if (candidates.All(c => c.Sky.Wcs is null))
            throw new SkyUnavailableException(
                $"No HDU of band '{band.Name}' has sky coordinates: {string.Join("; ", candidates.Select(c => $"{c.Name}: {c.Sky.Error}"))}.",
                candidates.FirstOrDefault()?.Sky.Error, parameter);

        var scope = named is null ? $"band '{band.Name}'" : $"HDU {named.Name} of band '{band.Name}'";
        var location = SkyLocator.Locate(candidates, sky, scope);
        if (location.Hdu is { } found) return (found, location.X, location.Y);
        var detail = location.Miss!;
        // Naming the wrong chip is an easy slip: say which one holds the position.
        if (named is not null && SkyLocator.Locate(band.Hdus, sky, $"band '{band.Name}'").Hdu is { } elsewhere)
            detail += $" It is on {elsewhere.Name} (hdu={elsewhere.Index}).";
        throw MosaicRequestException.NotFound("Position", detail, parameter);
    }
}
