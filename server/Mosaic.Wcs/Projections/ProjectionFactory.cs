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
            throw new NotSupportedException($"CTYPE1 '{header.CType1}': the '{header.Suffix}' distortion convention is not supported");
        double Pv(int m) => double.IsNaN(header.Pv2[m]) ? 0 : header.Pv2[m];
        return header.ProjectionCode switch
        {
            "TAN" => new GnomonicProjection(),
            "SIN" => new OrthographicProjection(Pv(1), Pv(2)),
            // Paper II section 6.1.2: NCP is SIN with xi = 0, eta = cot(delta0).
            "NCP" => header.CrVal2 == 0
                ? throw new WcsHeaderException("CRVAL2", "the NCP projection is undefined at declination 0")
                : new OrthographicProjection(0, 1 / Math.Tan(header.CrVal2 * Math.PI / 180)),
            "ARC" => new ZenithalEquidistantProjection(),
            "STG" => new StereographicProjection(),
            "ZEA" => new ZenithalEqualAreaProjection(),
            "CAR" => new PlateCarreeProjection(),
            "CYP" => new CylindricalPerspectiveProjection(double.IsNaN(header.Pv2[1]) ? 1 : header.Pv2[1], double.IsNaN(header.Pv2[2]) ? 1 : header.Pv2[2]),
            "CEA" => new CylindricalEqualAreaProjection(double.IsNaN(header.Pv2[1]) ? 1 : header.Pv2[1]),
            "MER" => new MercatorProjection(),
            "SFL" => new SansonFlamsteedProjection(),
            "PAR" => new ParabolicProjection(),
            "MOL" => new MollweideProjection(),
            "AIT" => new HammerAitoffProjection(),
            var code => throw new NotSupportedException($"CTYPE1 '{header.CType1}': the {code} projection is not supported"),
        };
    }
}
