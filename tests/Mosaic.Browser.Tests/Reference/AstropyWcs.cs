using System.Globalization;
using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Browser.Tests.Reference;

/// <summary>
/// Sky coordinates of FITS pixels from astropy.wcs (WCS.all_pix2world / all_world2pix, SIP included) and
/// astropy.coordinates (header frame to ICRS, ICRS to Galactic), Debian's python3-astropy run as /usr/bin/python3:
/// the reference the browser's sky readout, go-to box, grid, compass and scale bar are checked against.
/// </summary>
public static class AstropyWcs
{
    /// <summary>ICRS and Galactic positions of FITS 1-based pixel positions, in one python run.</summary>
    public static IReadOnlyList<SkyPoint> PixelToSky(string file, int hdu, IReadOnlyList<(double X, double Y)> pixels)
    {
        if (pixels.Count == 0) return [];
        var arguments = new List<string> { "pix2world", file, hdu.ToString(CultureInfo.InvariantCulture) };
        foreach (var (x, y) in pixels)
        {
            arguments.Add(x.ToString("R", CultureInfo.InvariantCulture));
            arguments.Add(y.ToString("R", CultureInfo.InvariantCulture));
        }
        var result = Run(arguments);
        return [.. result.GetProperty("points").EnumerateArray().Select(p => new SkyPoint(
            p.GetProperty("x").GetDouble(), p.GetProperty("y").GetDouble(),
            p.GetProperty("ra").GetDouble(), p.GetProperty("dec").GetDouble(),
            p.GetProperty("l").GetDouble(), p.GetProperty("b").GetDouble()))];
    }

    public static SkyPoint PixelToSky(string file, int hdu, double x, double y) => PixelToSky(file, hdu, [(x, y)])[0];

    /// <summary>
    /// The FITS 1-based pixel position of an ICRS position on one HDU (astropy.wcs all_world2pix, SIP included), and
    /// whether it falls on that HDU's pixels ([0.5, NAXIS + 0.5) each way).
    /// </summary>
    public static ChipPosition SkyToPixel(string file, int hdu, double ra, double dec)
    {
        var result = Run(["world2pix", file, hdu.ToString(CultureInfo.InvariantCulture),
            ra.ToString("R", CultureInfo.InvariantCulture), dec.ToString("R", CultureInfo.InvariantCulture)]);
        var point = result.GetProperty("points")[0];
        return new ChipPosition(hdu, point.GetProperty("x").GetDouble(), point.GetProperty("y").GetDouble(),
            result.GetProperty("width").GetInt32(), result.GetProperty("height").GetInt32());
    }

    /// <summary>North, east and the pixel scale at a pixel position, by finite differences of astropy's transforms.</summary>
    public static LocalSky Local(string file, int hdu, double x, double y)
    {
        var result = Run(["local", file, hdu.ToString(CultureInfo.InvariantCulture),
            x.ToString("R", CultureInfo.InvariantCulture), y.ToString("R", CultureInfo.InvariantCulture)]);
        static PixelVector Vector(JsonElement v) => new(v.GetProperty("dx").GetDouble(), v.GetProperty("dy").GetDouble());
        return new LocalSky(result.GetProperty("ra").GetDouble(), result.GetProperty("dec").GetDouble(),
            Vector(result.GetProperty("north")), Vector(result.GetProperty("east")), result.GetProperty("pixelScale").GetDouble());
    }

    private static JsonElement Run(IReadOnlyList<string> arguments)
    {
        var script = Path.Combine(AppContext.BaseDirectory, "Reference", "wcs_reference.py");
        var stdout = DebianPython.RunFile(script, arguments, timeout: TimeSpan.FromSeconds(60));
        return JsonDocument.Parse(stdout).RootElement.Clone();
    }
}
