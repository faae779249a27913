using FitsHeader = Mosaic.Fits.Header;

namespace Mosaic.Wcs.Header;

/// <summary>
/// The celestial WCS cards of an image (FITS WCS Paper I, Greisen &amp; Calabretta 2002, sections 2.1 and 6.1), with
/// the linear part reduced to a CD matrix in degrees per pixel whose first row gives the longitude and second the
/// latitude intermediate coordinate. The celestial pair may sit on header axes 1 and 2 in either order, in a header
/// of any number of axes; the other axes are left out.
/// </summary>
public sealed class WcsHeader
{
    /// <summary>CTYPE of the longitude axis, e.g. "RA---TAN".</summary>
    public required string CType1 { get; init; }
    /// <summary>CTYPE of the latitude axis, e.g. "DEC--TAN".</summary>
    public required string CType2 { get; init; }
    /// <summary>Header axis numbers (1-based) of the longitude and latitude axes: 1 and 2, or 2 and 1.</summary>
    public int LongitudeAxis { get; init; } = 1;
    public int LatitudeAxis { get; init; } = 2;
    /// <summary>Reference pixel on image axes 1 and 2, 1-based FITS pixel coordinates.</summary>
    public required double CrPix1 { get; init; }
    public required double CrPix2 { get; init; }
    /// <summary>Reference longitude and latitude, degrees.</summary>
    public required double CrVal1 { get; init; }
    public required double CrVal2 { get; init; }
    /// <summary>Degrees per pixel: longitude x = Cd11 (p1 - r1) + Cd12 (p2 - r2), latitude y = Cd21 (p1 - r1) + Cd22 (p2 - r2).</summary>
    public required double Cd11 { get; init; }
    public required double Cd12 { get; init; }
    public required double Cd21 { get; init; }
    public required double Cd22 { get; init; }
    /// <summary>CDELT of the longitude and latitude axes in the CDELT/PC and CDELT/CROTA forms, degrees; 1 with a CD matrix.</summary>
    public double CDelt1 { get; init; } = 1;
    public double CDelt2 { get; init; } = 1;
    public double? LonPole { get; init; }
    public double? LatPole { get; init; }
    /// <summary>PV{lon}_1 and PV{lon}_2: the native coordinates of the fiducial point, when the header moves it (Paper II section 2.5).</summary>
    public double? FiducialPhi { get; init; }
    public double? FiducialTheta { get; init; }
    public string? RadeSys { get; init; }
    public double? Equinox { get; init; }
    /// <summary>Projection parameters PV{lat}_m (m = 0..20), NaN where absent.</summary>
    public required IReadOnlyList<double> Pv2 { get; init; }

    /// <summary>The three-letter projection code, e.g. "TAN".</summary>
    public string ProjectionCode => CType1.Length >= 8 ? CType1.Substring(5, 3) : "";

    /// <summary>What follows the projection code, e.g. "-SIP"; empty when none.</summary>
    public string Suffix => CType1.Length > 8 ? CType1[8..] : "";

    /// <exception cref="WcsHeaderException">A celestial WCS card is missing or malformed, or the celestial axes are not image axes 1 and 2.</exception>
    public static WcsHeader From(FitsHeader header)
    {
        ArgumentNullException.ThrowIfNull(header);
        var (lon, lat) = CelestialAxes(header);
        var ctypeLon = RequiredString(header, $"CTYPE{lon}");
        var ctypeLat = RequiredString(header, $"CTYPE{lat}");
        CheckCelestialPair(ctypeLon, lon, ctypeLat, lat);
        CheckNoCoupling(header, AxisCount(header));
        double unitLon = UnitScale(header, $"CUNIT{lon}"), unitLat = UnitScale(header, $"CUNIT{lat}");

        // m[i, j]: header axis i (1-based) against pixel axis j, degrees (before the unit scale) per pixel.
        var m = new double[3, 3];
        double cdeltLon = 1, cdeltLat = 1;
        if (Enumerable.Range(1, 2).Any(i => Enumerable.Range(1, 2).Any(j => header.Contains($"CD{i}_{j}"))))
        {
            // Paper I section 2.1.2: absent CDi_j default to zero when any is present.
            for (var i = 1; i <= 2; i++)
                for (var j = 1; j <= 2; j++) m[i, j] = OptionalDouble(header, $"CD{i}_{j}") ?? 0;
        }
        else
        {
            var s = new double[3];
            for (var i = 1; i <= 2; i++)
            {
                s[i] = RequiredDouble(header, $"CDELT{i}");
                if (s[i] == 0) throw new WcsHeaderException($"CDELT{i}", "must not be zero");
            }
            var pc = new double[3, 3];
            var anyPc = Enumerable.Range(1, 2).Any(i => Enumerable.Range(1, 2).Any(j => header.Contains($"PC{i}_{j}")));
            if (anyPc || !header.Contains($"CROTA{lat}"))
            {
                // Paper I section 2.1.2: PCi_j defaults to the unit matrix.
                for (var i = 1; i <= 2; i++)
                    for (var j = 1; j <= 2; j++) pc[i, j] = OptionalDouble(header, $"PC{i}_{j}") ?? (i == j ? 1 : 0);
            }
            else
            {
                // Paper II section 6.1, eq. 188: the old CROTA rotation, carried by the latitude axis.
                var rho = RequiredDouble(header, $"CROTA{lat}") * Math.PI / 180;
                pc[lon, lon] = Math.Cos(rho); pc[lon, lat] = -(s[lat] / s[lon]) * Math.Sin(rho);
                pc[lat, lon] = (s[lon] / s[lat]) * Math.Sin(rho); pc[lat, lat] = Math.Cos(rho);
            }
            for (var i = 1; i <= 2; i++)
                for (var j = 1; j <= 2; j++) m[i, j] = s[i] * pc[i, j];
            cdeltLon = s[lon] * unitLon; cdeltLat = s[lat] * unitLat;
        }
        double cd11 = m[lon, 1] * unitLon, cd12 = m[lon, 2] * unitLon, cd21 = m[lat, 1] * unitLat, cd22 = m[lat, 2] * unitLat;
        if (cd11 * cd22 - cd12 * cd21 == 0) throw new WcsHeaderException("CD1_1", "the linear transformation matrix is singular");

        var pv = new double[21];
        for (var k = 0; k < pv.Length; k++) pv[k] = OptionalDouble(header, $"PV{lat}_{k}") ?? double.NaN;
        // Paper II Table 13: PV{lon}_1..4 are phi_0, theta_0, LONPOLE and LATPOLE; TPV uses the PV{lon}_m for its polynomial.
        var tpv = ctypeLon.Length >= 8 && ctypeLon.Substring(5, 3) == "TPV";
        // No projection of Paper II takes more than PV_20; a higher one would be silently dropped, so refuse it.
        if (!tpv)
            for (var k = pv.Length; k < 100; k++)
                if (header.Contains($"PV{lat}_{k}"))
                    throw new WcsHeaderException($"PV{lat}_{k}", $"projection parameters end at PV{lat}_{pv.Length - 1} (FITS WCS Paper II)");

        return new WcsHeader
        {
            CType1 = ctypeLon, CType2 = ctypeLat,
            LongitudeAxis = lon, LatitudeAxis = lat,
            CrPix1 = RequiredDouble(header, "CRPIX1"), CrPix2 = RequiredDouble(header, "CRPIX2"),
            CrVal1 = RequiredDouble(header, $"CRVAL{lon}") * unitLon, CrVal2 = RequiredDouble(header, $"CRVAL{lat}") * unitLat,
            Cd11 = cd11, Cd12 = cd12, Cd21 = cd21, Cd22 = cd22,
            CDelt1 = cdeltLon, CDelt2 = cdeltLat,
            LonPole = OptionalDouble(header, "LONPOLE") ?? (tpv ? null : OptionalDouble(header, $"PV{lon}_3")),
            LatPole = OptionalDouble(header, "LATPOLE") ?? (tpv ? null : OptionalDouble(header, $"PV{lon}_4")),
            FiducialPhi = tpv ? null : OptionalDouble(header, $"PV{lon}_1"),
            FiducialTheta = tpv ? null : OptionalDouble(header, $"PV{lon}_2"),
            // Paper I section 3.1: RADECSYS and EPOCH are the older spellings of RADESYS and EQUINOX.
            RadeSys = (header.GetString("RADESYS") ?? header.GetString("RADECSYS"))?.Trim(),
            Equinox = OptionalDouble(header, "EQUINOX") ?? OptionalDouble(header, "EPOCH"),
            Pv2 = pv,
        };
    }

    /// <summary>WCSAXES, else NAXIS, but at least 2 (Paper I section 2.2).</summary>
    private static int AxisCount(FitsHeader header)
    {
        var n = header.GetLong("WCSAXES") ?? header.GetLong("NAXIS") ?? 2;
        return (int)Math.Clamp(n, 2, 999);
    }

    private static bool IsLongitude(string ctype) => ctype.Length >= 5 && ctype[4] == '-' && ctype[..4] is "RA--" or "GLON" or "ELON";

    private static bool IsLatitude(string ctype) => ctype.Length >= 5 && ctype[4] == '-' && ctype[..4] is "DEC-" or "GLAT" or "ELAT";

    /// <summary>The header axes of the celestial longitude and latitude; they must be image axes 1 and 2.</summary>
    private static (int Lon, int Lat) CelestialAxes(FitsHeader header)
    {
        var n = AxisCount(header);
        int lon = 0, lat = 0;
        for (var i = 1; i <= n; i++)
        {
            if (header.Find($"CTYPE{i}") is not { Value: string text }) continue;
            var ctype = text.TrimEnd();
            if (IsLongitude(ctype)) { if (lon != 0) throw new WcsHeaderException($"CTYPE{i}", $"a second celestial longitude axis (the first is axis {lon})"); lon = i; }
            else if (IsLatitude(ctype)) { if (lat != 0) throw new WcsHeaderException($"CTYPE{i}", $"a second celestial latitude axis (the first is axis {lat})"); lat = i; }
        }
        if (lon == 0 || lat == 0)
        {
            // Name the card at fault: the first missing CTYPE, else the first that is not a celestial type.
            for (var i = 1; i <= n; i++)
                if (i != lon && i != lat && !header.Contains($"CTYPE{i}")) throw new WcsHeaderException($"CTYPE{i}", "is missing");
            for (var i = 1; i <= n; i++)
                if (i != lon && i != lat)
                {
                    var ctype = RequiredString(header, $"CTYPE{i}");
                    throw new WcsHeaderException($"CTYPE{i}", $"'{ctype}' is not a celestial axis type, and the image has no {(lon == 0 ? "longitude" : "latitude")} axis");
                }
        }
        if (!((lon == 1 && lat == 2) || (lon == 2 && lat == 1)))
            throw new WcsHeaderException($"CTYPE{Math.Max(lon, lat)}",
                $"the celestial axes are header axes {lon} and {lat}; they must be image axes 1 and 2 to map pixels to the sky");
        return (lon, lat);
    }

    /// <summary>A linear matrix that mixes the celestial pair with another axis would need that axis's pixel; refused.</summary>
    private static void CheckNoCoupling(FitsHeader header, int n)
    {
        for (var k = 3; k <= n; k++)
            for (var i = 1; i <= 2; i++)
                foreach (var key in new[] { $"PC{i}_{k}", $"PC{k}_{i}", $"CD{i}_{k}", $"CD{k}_{i}" })
                    if (OptionalDouble(header, key) is { } v && v != 0)
                        throw new WcsHeaderException(key, $"couples image axis {i} with axis {k}; a celestial plane must not depend on other axes");
    }

    private static void CheckCelestialPair(string ctypeLon, int lon, string ctypeLat, int lat)
    {
        // Paper II section 2: "xxxx-PPP", four-letter coordinate type padded with '-', then the projection code.
        if (ctypeLon.Length < 8) throw new WcsHeaderException($"CTYPE{lon}", $"'{ctypeLon}' has no projection code");
        if (ctypeLat.Length < 8) throw new WcsHeaderException($"CTYPE{lat}", $"'{ctypeLat}' has no projection code");
        var pair = (ctypeLon[..4], ctypeLat[..4]) switch
        {
            ("RA--", "DEC-") or ("GLON", "GLAT") or ("ELON", "ELAT") => true,
            _ => false,
        };
        if (!pair)
            throw new WcsHeaderException($"CTYPE{lat}", $"'{ctypeLon}' and '{ctypeLat}' are not longitude and latitude of one system");
        if (ctypeLon[4..] != ctypeLat[4..])
            throw new WcsHeaderException($"CTYPE{lat}", $"projection of '{ctypeLat}' differs from '{ctypeLon}'");
    }

    private static double UnitScale(FitsHeader header, string keyword)
    {
        var unit = header.GetString(keyword)?.Trim();
        return unit switch
        {
            null or "" or "deg" => 1,
            "arcmin" => 1.0 / 60,
            "arcsec" => 1.0 / 3600,
            "mas" => 1.0 / 3.6e6,
            "rad" => 180 / Math.PI,
            _ => throw new WcsHeaderException(keyword, $"unit '{unit}' is not an angle unit"),
        };
    }

    private static string RequiredString(FitsHeader header, string keyword)
    {
        var card = header.Find(keyword) ?? throw new WcsHeaderException(keyword, "is missing");
        return (card.Value as string)?.TrimEnd() ?? throw new WcsHeaderException(keyword, "must be a string");
    }

    private static double RequiredDouble(FitsHeader header, string keyword) =>
        OptionalDouble(header, keyword) ?? throw new WcsHeaderException(keyword, "is missing");

    private static double? OptionalDouble(FitsHeader header, string keyword)
    {
        if (header.Find(keyword) is not { } card) return null;
        var value = header.GetDouble(keyword) ?? throw new WcsHeaderException(keyword, $"must be a number, got '{card.Value}'");
        if (!double.IsFinite(value)) throw new WcsHeaderException(keyword, "must be finite");
        return value;
    }
}
