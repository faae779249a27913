using Mosaic.Server.Canvases;
using Mosaic.Server.Fields;
using Mosaic.Server.Pyramids;

namespace Mosaic.Server.Api;

/// <summary>Catalog types to the JSON the API documents.</summary>
public static class FieldMapper
{
    // Outline vertices to a millionth of a canvas pixel: far below what a screen shows, and short.
    private const int OutlineDecimals = 6;

    public static FieldDto ToDto(Field field, PyramidService pyramids)
    {
        var bands = field.Bands.Select(b => ToDto(b, pyramids)).ToList();
        var defaultBand = field.DefaultBand;
        var defaultHdu = defaultBand?.DefaultHdu;
        var defaultHdus = defaultBand is null ? [] : bands[field.Bands.ToList().IndexOf(defaultBand)].Hdus;
        return new FieldDto(field.Id, bands, defaultHdu?.Plane.Width, defaultHdu?.Plane.Height, defaultHdus,
            defaultBand?.Name, defaultHdu?.Index, field.Error, field.Problems.Select(p => new FileProblemDto(p.File, p.Error)).ToList());
    }

    private static BandDto ToDto(FieldBand band, PyramidService pyramids) =>
        new(band.Name, band.FileName, band.Files.Select(f => f.Name).ToList(), band.Version, band.Hdus.Select(h => ToDto(h, pyramids)).ToList(),
            band.Canvas is { } canvas ? ToDto(canvas, pyramids) : null, band.Error);

    private static CanvasDto ToDto(FieldCanvas canvas, PyramidService pyramids)
    {
        var hdu = canvas.Hdu;
        return new CanvasDto(canvas.Width, canvas.Height, hdu.Geometry.MaxZoom, Status(pyramids.GetStatus(hdu)), SkyMapper.ToDto(hdu.Sky),
            canvas.Canvas.Chips.Select(c => new CanvasChipDto(c.HduIndex, c.Name,
                c.Outline.Select(p => new[] { Math.Round(p.X, OutlineDecimals), Math.Round(p.Y, OutlineDecimals) }).ToList())).ToList(),
            canvas.Excluded.Select(e => new ExcludedChipDto(e.Hdu, e.Name, e.Reason)).ToList());
    }

    private static PyramidStatusDto Status(PyramidStatus status) =>
        new(status.State.ToString().ToLowerInvariant(), status.Progress, status.Error);

    private static HduDto ToDto(FieldHdu hdu, PyramidService pyramids)
    {
        return new HduDto(hdu.Index, hdu.Name, hdu.Plane.Width, hdu.Plane.Height, hdu.Plane.BitPix, hdu.Unit,
            hdu.Geometry.MaxZoom, Status(pyramids.GetStatus(hdu)),
            SkyMapper.ToDto(hdu.Sky), hdu.Sky.Error, hdu.File?.Name, hdu.FitsIndex != hdu.Index ? hdu.FitsIndex : null);
    }
}
