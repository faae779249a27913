using Mosaic.Server.Fields;
using Mosaic.Wcs.Coordinates;

namespace Mosaic.Server.Api;

/// <summary>A probed position to the JSON the API documents, with its ICRS and Galactic coordinates where the HDU has a WCS.</summary>
public static class ProbeMapper
{
    public static ProbeDto ToDto(FieldHdu hdu, double atX, double atY, int x, int y, double value)
    {
        ArgumentNullException.ThrowIfNull(hdu);
        SkyPosition? icrs = hdu.Sky.Wcs is { } wcs && wcs.TryPixelToIcrs(atX, atY, out var found) ? found : null;
        var galactic = icrs is null ? null : Galactic.FromIcrs(icrs);
        return new ProbeDto(hdu.Band.Field.Id, hdu.Band.Name, hdu.Index, hdu.Name, x, y, double.IsNaN(value) ? null : value, hdu.Unit,
            atX, atY, icrs?.RightAscension, icrs?.Declination,
            icrs is null ? null : SexagesimalFormatter.FormatRightAscension(icrs.RightAscension),
            icrs is null ? null : SexagesimalFormatter.FormatDeclination(icrs.Declination),
            galactic?.Longitude, galactic?.Latitude);
    }
}
