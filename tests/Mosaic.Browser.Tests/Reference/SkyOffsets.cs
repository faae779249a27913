using System.Globalization;
using System.Text.Json;
using Mosaic.Testing;

namespace Mosaic.Browser.Tests.Reference;

/// <summary>
/// Pixel positions of a sky position and of points offset from it along east and north, from astropy (Debian's
/// python3-astropy as /usr/bin/python3): SkyCoord.spherical_offsets_by for the offsets, the header's frame by
/// wcs_to_celestial_frame, WCS.all_world2pix (SIP included, FITS 1-based) for the pixels; and the position written
/// sexagesimal by astropy's Angle.to_string. The reference the markers' places, sizes and downloads are checked
/// against.
/// </summary>
public static class SkyOffsets
{
    private const string Script = """
        import json
        import sys
        import warnings
        try:
            from astropy.io import fits
            from astropy.wcs import WCS, FITSFixedWarning
            from astropy.wcs.utils import wcs_to_celestial_frame
            from astropy.coordinates import SkyCoord
            import astropy.units as u
        except ImportError as error:
            print(f"No module named astropy: python3-astropy missing ({error})", file=sys.stderr)
            sys.exit(3)
        warnings.simplefilter("ignore", FITSFixedWarning)
        path, hdu, ra, dec = sys.argv[1], int(sys.argv[2]), float(sys.argv[3]), float(sys.argv[4])
        offsets = [float(v) for v in sys.argv[5:]]
        with fits.open(path, memmap=False) as hdus:
            header = hdus[hdu].header.copy()
        wcs = WCS(header)
        frame = wcs_to_celestial_frame(wcs)
        centre = SkyCoord(ra * u.deg, dec * u.deg, frame="icrs")
        points = [centre] + [centre.spherical_offsets_by(e * u.arcsec, n * u.arcsec) for e, n in zip(offsets[0::2], offsets[1::2])]
        pixels = []
        for point in points:
            native = point.transform_to(frame)
            x, y = wcs.all_world2pix(native.spherical.lon.deg, native.spherical.lat.deg, 1, tolerance=1e-10, maxiter=100)
            pixels.append({"x": float(x), "y": float(y)})
        print(json.dumps({
            "points": pixels,
            "raHours": centre.ra.to_string(unit=u.hour, sep=":", precision=3, pad=True),
            "decDegrees": centre.dec.to_string(unit=u.deg, sep=":", precision=2, alwayssign=True, pad=True),
        }))
        """;

    /// <summary>
    /// The pixel of ICRS (<paramref name="ra"/>, <paramref name="dec"/>) on one HDU, then of each offset (east, north
    /// in arcsec) from it, and the position as "hh:mm:ss.sss" / "±dd:mm:ss.ss".
    /// </summary>
    public static SkyOffsetResult Compute(string file, int hdu, double ra, double dec, params (double East, double North)[] offsets)
    {
        var arguments = new List<string> { file, hdu.ToString(CultureInfo.InvariantCulture), Text(ra), Text(dec) };
        foreach (var (east, north) in offsets)
        {
            arguments.Add(Text(east));
            arguments.Add(Text(north));
        }
        var root = JsonDocument.Parse(DebianPython.RunCode(Script, arguments, timeout: TimeSpan.FromSeconds(60))).RootElement;
        var points = root.GetProperty("points").EnumerateArray().Select(p => (p.GetProperty("x").GetDouble(), p.GetProperty("y").GetDouble())).ToList();
        return new SkyOffsetResult(points[0], points.Skip(1).ToList(), root.GetProperty("raHours").GetString()!, root.GetProperty("decDegrees").GetString()!);
    }

    private static string Text(double value) => value.ToString("R", CultureInfo.InvariantCulture);
}
