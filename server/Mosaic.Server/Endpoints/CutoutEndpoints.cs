using System.ComponentModel;
using System.Globalization;
using System.Text;
using Mosaic.Server.Cutouts;
using Mosaic.Server.Fields;
using Mosaic.Server.Hosting;
using Mosaic.Server.Security;

namespace Mosaic.Server.Endpoints;

public static class CutoutEndpoints
{
    public static RouteGroupBuilder MapCutoutEndpoints(this IEndpointRouteBuilder routes)
    {
        var group = routes.MapGroup("/api/fields").WithTags("Cutouts");
        group.MapGet("/{field}/cutout.fits", Cutout)
            .WithSummary("A FITS file of a pixel box (x0, y0, x1, y1) or of a sky position (ra and dec, or position) and size: the original values, BITPIX and scaling, the source header with CRPIX shifted (SIP/TPV kept), EXTNAME, DATE and HISTORY of where it was cut from. hdu=canvas with a box: the resampled canvas as float32 with its TAN WCS.")
            .Produces(StatusCodes.Status200OK, contentType: "application/fits")
            .Expensive();
        return group;
    }

    private static CutoutResult Cutout(
        string field,
        [Description("Band name (case-insensitive); the field's first band when absent.")] string? band,
        [Description("Chip: HDU index (the band's chip number where the band spans several files), EXTNAME or chip name, or canvas. With a pixel box it names the image (canvas: the resampled canvas); with a position, absent or canvas finds the chip that holds it.")] string? hdu,
        [Description("Box: first column, FITS 1-based.")] string? x0,
        [Description("Box: first row, FITS 1-based.")] string? y0,
        [Description("Box: last column (inclusive).")] string? x1,
        [Description("Box: last row (inclusive).")] string? y1,
        [Description("Centre: ICRS right ascension, decimal degrees (with dec).")] string? ra,
        [Description("Centre: ICRS declination, decimal degrees (with ra).")] string? dec,
        [Description("Centre as typed text, e.g. '12:34:56.7 -01:02:03' (instead of ra and dec).")] string? position,
        [Description("With a position: the size in arcseconds, one value (square) or 'width,height'. The box is cut at the image edge.")] string? size,
        FieldCatalog catalog, MosaicOptions options)
    {
        var target = catalog.Get(field).ResolveBand(band);
        var request = CutoutQuery.Resolve(target, hdu, x0, y0, x1, y1, ra, dec, position, size, options.CutoutPixelLimit);
        var pixels = CutoutPixels.For(request.Hdu);
        var cards = CutoutHeader.Build(request.Hdu.Hdu.Header, request.Hdu.Name, request.Box.X0, request.Box.Y0, pixels.PhysicalFloats,
            History(request), request.Hdu.Unit ?? StatisticsEndpoints.BandUnit(target), DateTime.UtcNow);
        return new CutoutResult(request, pixels, cards, FileName(request));
    }

    /// <summary>What the cutout was cut from, in words a reader of the header can follow.</summary>
    private static List<string> History(CutoutRequest request)
    {
        var hdu = request.Hdu;
        var box = request.Box;
        var lines = new List<string> { $"Mosaic cutout of field '{hdu.Band.Field.Id}', band '{hdu.Band.Name}'." };
        if (hdu.IsCanvas)
        {
            lines.Add($"Cut from the band's whole-field canvas ({hdu.Plane.Width} x {hdu.Plane.Height} pixels).");
            lines.Add("Values were resampled from the original chips onto the canvas grid:");
            lines.Add("each canvas pixel maps to a chip by its WCS (canvas -> sky -> chip,");
            lines.Add("SIP inverse included) and takes the bilinear interpolation of the four");
            lines.Add("chip pixels around it, or the nearest one where any of them is masked;");
            lines.Add("NaN outside every chip. These are not the chips' original values.");
        }
        else
        {
            lines.Add($"Cut from file '{Path.GetFileName(hdu.Plane.FilePath)}', HDU {hdu.Hdu.Index} ('{hdu.Name}').");
        }
        lines.Add($"Pixels x {box.X0}..{box.X1}, y {box.Y0}..{box.Y1} of that image (FITS 1-based, inclusive).");
        if (request.Centre is { } centre && request.SizeArcsec is var (w, h))
        {
            lines.Add(string.Create(CultureInfo.InvariantCulture, $"Centred on RA {centre.RightAscension:0.0000000}, Dec {centre.Declination:0.0000000} (ICRS deg), {w:0.###} x {h:0.###} arcsec."));
            if (request.Clipped) lines.Add("The box reached past the image edge and was cut there.");
        }
        return lines;
    }

    private static string FileName(CutoutRequest request)
    {
        var box = request.Box;
        var name = $"{request.Hdu.Band.Field.Id}-{request.Hdu.Band.Name}-{request.Hdu.Name}-x{box.X0}-{box.X1}-y{box.Y0}-{box.Y1}.fits";
        var safe = new StringBuilder(name.Length);
        foreach (var c in name) safe.Append(char.IsAsciiLetterOrDigit(c) || c is '-' or '_' or '.' ? c : '_');
        return safe.ToString();
    }
}
