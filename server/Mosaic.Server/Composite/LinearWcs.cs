using Mosaic.Fits;

namespace Mosaic.Server.Composite;

/// <summary>
/// The reference point and linear matrix of a celestial WCS (FITS WCS Paper I, sections 2.1 and 2.1.2): what two
/// bands must share to be composed pixel for pixel. Unlike Mosaic.Wcs it needs no usable projection, so bands whose
/// projection Mosaic cannot evaluate still compose when their headers agree.
/// </summary>
public sealed record LinearWcs(double Crpix1, double Crpix2, double Crval1, double Crval2, double M11, double M12, double M21, double M22)
{
    /// <summary>Null without CTYPE1 and CTYPE2. Missing keywords take the defaults of Paper I (CRPIX/CRVAL 0, PC identity, CDELT 1).</summary>
    public static LinearWcs? From(Header header)
    {
        ArgumentNullException.ThrowIfNull(header);
        if (string.IsNullOrWhiteSpace(header.GetString("CTYPE1")) || string.IsNullOrWhiteSpace(header.GetString("CTYPE2"))) return null;
        double Value(string keyword, double fallback) => header.GetDouble(keyword) ?? fallback;
        var crpix1 = Value("CRPIX1", 0);
        var crpix2 = Value("CRPIX2", 0);
        var crval1 = Value("CRVAL1", 0);
        var crval2 = Value("CRVAL2", 0);
        if (header.Contains("CD1_1") || header.Contains("CD1_2") || header.Contains("CD2_1") || header.Contains("CD2_2"))
            return new LinearWcs(crpix1, crpix2, crval1, crval2, Value("CD1_1", 0), Value("CD1_2", 0), Value("CD2_1", 0), Value("CD2_2", 0));
        var cdelt1 = Value("CDELT1", 1);
        var cdelt2 = Value("CDELT2", 1);
        return new LinearWcs(crpix1, crpix2, crval1, crval2,
            cdelt1 * Value("PC1_1", 1), cdelt1 * Value("PC1_2", 0), cdelt2 * Value("PC2_1", 0), cdelt2 * Value("PC2_2", 1));
    }

    /// <summary>
    /// Null where every number agrees within <paramref name="tolerance"/> relative: reference pixel and value to the
    /// larger magnitude (at least 1), matrix elements to the matrix's largest element, so a zero rotation term compares.
    /// </summary>
    public string? DifferenceFrom(LinearWcs other, double tolerance)
    {
        ArgumentNullException.ThrowIfNull(other);
        if (!Near(Crpix1, other.Crpix1, 1) || !Near(Crpix2, other.Crpix2, 1))
            return $"reference pixel CRPIX ({Crpix1}, {Crpix2}) against ({other.Crpix1}, {other.Crpix2})";
        if (!Near(Crval1, other.Crval1, 1) || !Near(Crval2, other.Crval2, 1))
            return $"reference value CRVAL ({Crval1}, {Crval2}) against ({other.Crval1}, {other.Crval2})";
        var scale = new[] { M11, M12, M21, M22, other.M11, other.M12, other.M21, other.M22 }.Max(Math.Abs);
        if (!Near(M11, other.M11, scale) || !Near(M12, other.M12, scale) || !Near(M21, other.M21, scale) || !Near(M22, other.M22, scale))
            return $"pixel scale and rotation (CD matrix [{M11}, {M12}; {M21}, {M22}] against [{other.M11}, {other.M12}; {other.M21}, {other.M22}])";
        return null;

        bool Near(double a, double b, double floor) => Math.Abs(a - b) <= tolerance * Math.Max(floor, Math.Max(Math.Abs(a), Math.Abs(b)));
    }
}
