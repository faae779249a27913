using Mosaic.Server.Api;
using Mosaic.Server.Canvases;
using Mosaic.Server.Errors;
using Mosaic.Server.Fields;
using Mosaic.Server.Sky;

namespace Mosaic.Server.Endpoints;

/// <summary>
/// A probe on a band's whole-field canvas (hdu=canvas): the canvas position, by x/y or from a sky position through
/// the canvas WCS, then the original chip there by the exact WCS chain, its 1-based pixel and its original value —
/// never the resampled one. A gap between chips answers with no chip and no value.
/// </summary>
public static class CanvasProbe
{
    public static bool IsCanvas(string? hdu) =>
        !string.IsNullOrWhiteSpace(hdu) && string.Equals(hdu.Trim(), FieldCanvas.HduName, StringComparison.OrdinalIgnoreCase);

    /// <exception cref="MosaicRequestException">The band has no canvas (404), x/y lie off the canvas (400), or the sky position lies off it (404, saying why).</exception>
    public static ProbeDto Probe(FieldBand band, ProbeQuery query)
    {
        ArgumentNullException.ThrowIfNull(band);
        ArgumentNullException.ThrowIfNull(query);
        var canvasHdu = band.ResolveHdu(FieldCanvas.HduName);
        var canvas = band.Canvas!;
        double x, y;
        if (query.Sky is { } sky)
        {
            var wcs = canvasHdu.Sky.Wcs
                ?? throw new SkyUnavailableException($"The canvas of band '{band.Name}' has no sky coordinates: {canvasHdu.Sky.Error}.", canvasHdu.Sky.Error, "hdu");
            if (!wcs.TryIcrsToPixel(sky, out x, out y) || !Inside(x, canvas.Width) || !Inside(y, canvas.Height))
            {
                var placed = band.Hdus.Where(h => h.Sky.Wcs is not null).ToList();
                var miss = SkyLocator.Locate(placed, sky, $"band '{band.Name}'").Miss ?? "it lies off the canvas.";
                throw MosaicRequestException.NotFound("Position", miss, query.SkyParameter);
            }
        }
        else
        {
            (x, y) = (query.X, query.Y);
            Check("x", x, canvas.Width);
            Check("y", y, canvas.Height);
        }

        if (!canvas.TryLocate(x, y, out var chip, out var chipX, out var chipY))
            return ProbeMapper.ToCanvasGapDto(canvas, x, y);
        var px = Pixel(chipX, chip!.Plane.Width);
        var py = Pixel(chipY, chip.Plane.Height);
        return ProbeMapper.ToCanvasDto(canvas, x, y, chip, chipX, chipY, px, py, chip.Plane.ReadValue(px - 1, py - 1));
    }

    private static bool Inside(double coordinate, int size) => coordinate >= 0.5 && coordinate < size + 0.5;

    private static void Check(string name, double coordinate, int size)
    {
        if (!Inside(coordinate, size))
            throw MosaicRequestException.BadParameter(name, $"'{name}' = {coordinate} is outside the canvas, whose pixels run from 1 to {size} (edges at 0.5 and {size + 0.5}).");
    }

    // The chip position lies within the chip's outer edges, so the containing pixel is 1..size; the clamp only
    // guards the last rounding at an edge.
    private static int Pixel(double coordinate, int size) => (int)Math.Clamp(Math.Floor(coordinate + 0.5), 1, size);
}
