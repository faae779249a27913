using FitsHeader = Mosaic.Fits.Header;

namespace Mosaic.Wcs.Header;

/// <summary>
/// The celestial WCS cards of a two-axis image (FITS WCS Paper I, Greisen &amp; Calabretta 2002, sections 2.1 and 6.1),
/// with the linear part reduced to a CD matrix in degrees per pixel. Axis 1 is longitude, axis 2 latitude.
/// </summary>
public sealed class WcsHeader
{
    public required string CType1 { get; init; }
    public required string CType2 { get; init; }
    /// <summary>Reference pixel, 1-based FITS pixel coordinates.</summary>
    public required double CrPix1 { get; init; }
    public required double CrPix2 { get; init; }
    /// <summary>Reference world coordinate, degrees.</summary>
    public required double CrVal1 { get; init; }
    public required double CrVal2 { get; init; }
    /// <summary>Degrees per pixel: intermediate x_i = sum_j Cd[i,j] (p_j - r_j), indices 0-based.</summary>
    public required double Cd11 { get; init; }
    public required double Cd12 { get; init; }
    public required double Cd21 { get; init; }
    public required double Cd22 { get; init; }
    public double? LonPole { get; init; }
    public double? LatPole { get; init; }
    public string? RadeSys { get; init; }
    public double? Equinox { get; init; }
    /// <summary>PV2_m projection parameters (m = 0..20), NaN where absent.</summary>
    public required IReadOnlyList<double> Pv2 { get; init; }

    /// <summary>The three-letter projection code, e.g. "TAN".</summary>
    public string ProjectionCode => CType1.Length >= 8 ? CType1.Substring(5, 3) : "";

    /// <summary>What follows the projection code, e.g. "-SIP"; empty when none.</summary>
    public string Suffix => CType1.Length > 8 ? CType1[8..] : "";

    /// <exception cref="WcsHeaderException">A celestial WCS card is missing or malformed.</exception>
    public static WcsHeader From(FitsHeader header)
    {
        ArgumentNullException.ThrowIfNull(header);
        var ctype1 = RequiredString(header, "CTYPE1");
        var ctype2 = RequiredString(header, "CTYPE2");
        CheckCelestialPair(ctype1, ctype2);
        double unit1 = UnitScale(header, "CUNIT1"), unit2 = UnitScale(header, "CUNIT2");

        double cd11, cd12, cd21, cd22;
        if (header.Contains("CD1_1") || header.Contains("CD1_2") || header.Contains("CD2_1") || header.Contains("CD2_2"))
        {
            // Paper I section 2.1.2: absent CDi_j default to zero when any is present.
            cd11 = OptionalDouble(header, "CD1_1") ?? 0; cd12 = OptionalDouble(header, "CD1_2") ?? 0;
            cd21 = OptionalDouble(header, "CD2_1") ?? 0; cd22 = OptionalDouble(header, "CD2_2") ?? 0;
        }
        else
        {
            double s1 = RequiredDouble(header, "CDELT1"), s2 = RequiredDouble(header, "CDELT2");
            if (s1 == 0) throw new WcsHeaderException("CDELT1", "must not be zero");
            if (s2 == 0) throw new WcsHeaderException("CDELT2", "must not be zero");
            double pc11, pc12, pc21, pc22;
            if (header.Contains("PC1_1") || header.Contains("PC1_2") || header.Contains("PC2_1") || header.Contains("PC2_2") || !header.Contains("CROTA2"))
            {
                // Paper I section 2.1.2: PCi_j defaults to the unit matrix.
                pc11 = OptionalDouble(header, "PC1_1") ?? 1; pc12 = OptionalDouble(header, "PC1_2") ?? 0;
                pc21 = OptionalDouble(header, "PC2_1") ?? 0; pc22 = OptionalDouble(header, "PC2_2") ?? 1;
            }
            else
            {
                // Paper II section 6.1, eq. 188: the old CROTA2 rotation of the latitude axis.
                var rho = RequiredDouble(header, "CROTA2") * Math.PI / 180;
                pc11 = Math.Cos(rho); pc12 = -(s2 / s1) * Math.Sin(rho);
                pc21 = (s1 / s2) * Math.Sin(rho); pc22 = Math.Cos(rho);
            }
            cd11 = s1 * pc11; cd12 = s1 * pc12; cd21 = s2 * pc21; cd22 = s2 * pc22;
        }
        cd11 *= unit1; cd12 *= unit1; cd21 *= unit2; cd22 *= unit2;
        if (cd11 * cd22 - cd12 * cd21 == 0) throw new WcsHeaderException("CD1_1", "the linear transformation matrix is singular");

        var pv = new double[21];
        for (var m = 0; m < pv.Length; m++) pv[m] = OptionalDouble(header, $"PV2_{m}") ?? double.NaN;

        return new WcsHeader
        {
            CType1 = ctype1, CType2 = ctype2,
            CrPix1 = RequiredDouble(header, "CRPIX1"), CrPix2 = RequiredDouble(header, "CRPIX2"),
            CrVal1 = RequiredDouble(header, "CRVAL1") * unit1, CrVal2 = RequiredDouble(header, "CRVAL2") * unit2,
            Cd11 = cd11, Cd12 = cd12, Cd21 = cd21, Cd22 = cd22,
            LonPole = OptionalDouble(header, "LONPOLE"), LatPole = OptionalDouble(header, "LATPOLE"),
            RadeSys = header.GetString("RADESYS")?.Trim(),
            Equinox = OptionalDouble(header, "EQUINOX"),
            Pv2 = pv,
        };
    }

    private static void CheckCelestialPair(string ctype1, string ctype2)
    {
        // Paper II section 2: "xxxx-PPP", four-letter coordinate type padded with '-', then the projection code.
        if (ctype1.Length < 8 || ctype1[4] != '-') throw new WcsHeaderException("CTYPE1", $"'{ctype1}' is not a celestial axis type");
        if (ctype2.Length < 8 || ctype2[4] != '-') throw new WcsHeaderException("CTYPE2", $"'{ctype2}' is not a celestial axis type");
        var lng = ctype1[..4];
        var lat = ctype2[..4];
        var pair = (lng, lat) switch
        {
            ("RA--", "DEC-") or ("GLON", "GLAT") or ("ELON", "ELAT") => true,
            _ => false,
        };
        if (!pair)
            throw new WcsHeaderException("CTYPE1", $"axes 1 and 2 must be longitude then latitude of one system, got '{ctype1}' and '{ctype2}'");
        if (ctype1.Substring(5, 3) != ctype2.Substring(5, 3))
            throw new WcsHeaderException("CTYPE2", $"projection of '{ctype2}' differs from '{ctype1}'");
    }

    private static double UnitScale(FitsHeader header, string keyword)
    {
        var unit = header.GetString(keyword)?.Trim();
        return unit switch
        {
            null or "" or "deg" => 1,
            "arcmin" => 1.0 / 60,
            "arcsec" => 1.0 / 3600,
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
