using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;

namespace Mosaic.Server.Api;

/// <summary>Catalog types to the JSON the API documents.</summary>
public static class FieldMapper
{
    public static FieldDto ToDto(Field field, PyramidService pyramids)
    {
        var bands = field.Bands.Select(b => ToDto(b, pyramids)).ToList();
        var defaultBand = field.DefaultBand;
        var defaultHdu = defaultBand?.DefaultHdu;
        var defaultHdus = defaultBand is null ? [] : bands[field.Bands.ToList().IndexOf(defaultBand)].Hdus;
        return new FieldDto(field.Id, bands, defaultHdu?.Plane.Width, defaultHdu?.Plane.Height, defaultHdus,
            defaultBand?.Name, defaultHdu?.Index, field.Error);
    }

    private static BandDto ToDto(FieldBand band, PyramidService pyramids) =>
        new(band.Name, band.FileName, band.Version, band.Hdus.Select(h => ToDto(h, pyramids)).ToList(), band.Error);

    private static HduDto ToDto(FieldHdu hdu, PyramidService pyramids)
    {
        var status = pyramids.GetStatus(hdu);
        return new HduDto(hdu.Index, hdu.Name, hdu.Plane.Width, hdu.Plane.Height, hdu.Plane.BitPix, hdu.Unit,
            hdu.Geometry.MaxZoom, new PyramidStatusDto(status.State.ToString().ToLowerInvariant(), status.Progress, status.Error),
            SkyMapper.ToDto(hdu.Sky), hdu.Sky.Error);
    }
}
