using Mosaic.Wcs.Header;

namespace Mosaic.Wcs.Projections;

/// <summary>The projection a CTYPE code names; a code not implemented here is refused, never approximated.</summary>
public static class ProjectionFactory
{
    /// <summary>The projection of <paramref name="header"/>; a "-SIP" suffix is read separately by the caller.</summary>
    /// <exception cref="NotSupportedException">The projection code or CTYPE suffix is not supported.</exception>
    public static Projection Create(WcsHeader header)
    {
        ArgumentNullException.ThrowIfNull(header);
        if (header.Suffix.Length > 0 && header.Suffix != "-SIP")
            throw new NotSupportedException($"CTYPE{header.LongitudeAxis} '{header.CType1}': the '{header.Suffix}' distortion convention is not supported");
        double Pv(int m) => double.IsNaN(header.Pv2[m]) ? 0 : header.Pv2[m];
        double PvOr(int m, double fallback) => double.IsNaN(header.Pv2[m]) ? fallback : header.Pv2[m];
        return header.ProjectionCode switch
        {
            "AZP" => new AzimuthalPerspectiveProjection(Pv(1), Pv(2)),
            "SZP" => new SlantZenithalPerspectiveProjection(Pv(1), Pv(2), PvOr(3, 90)),
            "TAN" => new GnomonicProjection(),
            // The TPV convention: TAN after a polynomial distortion whose terms fill PV1_m and PV2_m.
            "TPV" => new GnomonicProjection(),
            "TNX" or "ZPX" or "TPD" => throw new NotSupportedException($"CTYPE{header.LongitudeAxis} '{header.CType1}': the {header.ProjectionCode} distortion convention is not supported"),
            "SIN" => new OrthographicProjection(Pv(1), Pv(2)),
            // Paper II section 6.1.2: NCP is SIN with xi = 0, eta = cot(delta0).
            "NCP" => header.CrVal2 == 0
                ? throw new WcsHeaderException("CRVAL2", "the NCP projection is undefined at declination 0")
                : new OrthographicProjection(0, 1 / Math.Tan(header.CrVal2 * Math.PI / 180)),
            "ARC" => new ZenithalEquidistantProjection(),
            "STG" => new StereographicProjection(),
            "ZPN" => new ZenithalPolynomialProjection(Enumerable.Range(0, header.Pv2.Count).Select(Pv).ToArray()),
            "ZEA" => new ZenithalEqualAreaProjection(),
            "AIR" => new AiryProjection(PvOr(1, 90)),
            "CAR" => new PlateCarreeProjection(),
            "CYP" => new CylindricalPerspectiveProjection(double.IsNaN(header.Pv2[1]) ? 1 : header.Pv2[1], double.IsNaN(header.Pv2[2]) ? 1 : header.Pv2[2]),
            "CEA" => new CylindricalEqualAreaProjection(double.IsNaN(header.Pv2[1]) ? 1 : header.Pv2[1]),
            "MER" => new MercatorProjection(),
            "COP" => new ConicPerspectiveProjection(header.Pv2[1], Pv(2)),
            "COE" => new ConicEqualAreaProjection(header.Pv2[1], Pv(2)),
            "COD" => new ConicEquidistantProjection(header.Pv2[1], Pv(2)),
            "COO" => new ConicOrthomorphicProjection(header.Pv2[1], Pv(2)),
            "SFL" => new SansonFlamsteedProjection(),
            // Paper II section 5.6.1: Bonne with theta_1 = 0 is Sanson-Flamsteed.
            "BON" => header.Pv2[1] == 0 ? new SansonFlamsteedProjection() : new BonneProjection(header.Pv2[1]),
            "PCO" => new PolyconicProjection(),
            "TSC" => new TangentialSphericalCubeProjection(),
            "CSC" => new CobeSphericalCubeProjection(),
            "QSC" => new QuadrilateralizedSphericalCubeProjection(),
            "HPX" => new HealpixProjection(PvOr(1, 4), PvOr(2, 3)),
            "PAR" => new ParabolicProjection(),
            "MOL" => new MollweideProjection(),
            "AIT" => new HammerAitoffProjection(),
            var code => throw new NotSupportedException($"CTYPE{header.LongitudeAxis} '{header.CType1}': the {code} projection is not supported"),
        };
    }
}
