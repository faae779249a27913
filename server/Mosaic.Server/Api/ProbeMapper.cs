using Mosaic.Server.Canvases;
using Mosaic.Server.Fields;
using Mosaic.Wcs.Coordinates;

namespace Mosaic.Server.Api;

/// <summary>A probed position to the JSON the API documents, with its ICRS and Galactic coordinates where the HDU has a WCS.</summary>
public static class ProbeMapper
{
    public static ProbeDto ToDto(FieldHdu hdu, double atX, double atY, int x, int y, double value)
    {
        ArgumentNullException.ThrowIfNull(hdu);
        var icrs = Icrs(hdu.Sky.Wcs, atX, atY);
        return WithSky(new ProbeDto(hdu.Band.Field.Id, hdu.Band.Name, hdu.Index, hdu.Name, x, y, double.IsNaN(value) ? null : value, hdu.Unit,
            atX, atY, null, null, null, null, null, null, File: hdu.File?.Name, FitsIndex: FitsIndexOf(hdu)), icrs);
    }

    /// <summary>A canvas point on a chip: the chip's own pixel and value; the sky position from the canvas WCS.</summary>
    public static ProbeDto ToCanvasDto(FieldCanvas canvas, double canvasX, double canvasY, FieldHdu chip, double atX, double atY, int x, int y, double value)
    {
        ArgumentNullException.ThrowIfNull(canvas);
        ArgumentNullException.ThrowIfNull(chip);
        var icrs = Icrs(canvas.Hdu.Sky.Wcs, canvasX, canvasY);
        return WithSky(new ProbeDto(chip.Band.Field.Id, chip.Band.Name, chip.Index, chip.Name, x, y, double.IsNaN(value) ? null : value, chip.Unit,
            atX, atY, null, null, null, null, null, null, new CanvasPointDto(canvasX, canvasY), chip.File?.Name, FitsIndexOf(chip)), icrs);
    }

    /// <summary>A canvas point in a gap between chips: no chip, no value; the sky position still.</summary>
    public static ProbeDto ToCanvasGapDto(FieldCanvas canvas, double canvasX, double canvasY)
    {
        ArgumentNullException.ThrowIfNull(canvas);
        var icrs = Icrs(canvas.Hdu.Sky.Wcs, canvasX, canvasY);
        return WithSky(new ProbeDto(canvas.Band.Field.Id, canvas.Band.Name, null, null, null, null, null, null,
            null, null, null, null, null, null, null, null, new CanvasPointDto(canvasX, canvasY)), icrs);
    }

    private static int? FitsIndexOf(FieldHdu chip) => chip.FitsIndex != chip.Index ? chip.FitsIndex : null;

    private static SkyPosition? Icrs(Mosaic.Wcs.Wcs? wcs, double x, double y) =>
        wcs is not null && wcs.TryPixelToIcrs(x, y, out var found) ? found : null;

    private static ProbeDto WithSky(ProbeDto dto, SkyPosition? icrs)
    {
        if (icrs is null) return dto;
        var galactic = Galactic.FromIcrs(icrs);
        return dto with
        {
            Ra = icrs.RightAscension,
            Dec = icrs.Declination,
            RaSexagesimal = SexagesimalFormatter.FormatRightAscension(icrs.RightAscension),
            DecSexagesimal = SexagesimalFormatter.FormatDeclination(icrs.Declination),
            L = galactic.Longitude,
            B = galactic.Latitude,
        };
    }
}
