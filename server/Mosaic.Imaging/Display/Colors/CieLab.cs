namespace Mosaic.Imaging.Display.Colors;

/// <summary>
/// CIE 1976 L*a*b* of an sRGB colour (IEC 61966-2-1 transfer and D65 primaries, CIE 15 Lab with the D65 white):
/// used to keep palettes monotone in lightness and masked colours far from every palette entry.
/// </summary>
public readonly record struct CieLab(double L, double A, double B)
{
    public static CieLab From(Rgb c)
    {
        var r = Linear(c.R);
        var g = Linear(c.G);
        var b = Linear(c.B);
        var x = 0.4124 * r + 0.3576 * g + 0.1805 * b;
        var y = 0.2126 * r + 0.7152 * g + 0.0722 * b;
        var z = 0.0193 * r + 0.1192 * g + 0.9505 * b;
        double fx = F(x / 0.95047), fy = F(y), fz = F(z / 1.08883);
        return new CieLab(116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz));
    }

    /// <summary>CIE76 colour difference: Euclidean distance in L*a*b*.</summary>
    public double DistanceTo(CieLab other)
    {
        double dl = L - other.L, da = A - other.A, db = B - other.B;
        return Math.Sqrt(dl * dl + da * da + db * db);
    }

    private static double Linear(byte channel)
    {
        var c = channel / 255.0;
        return c <= 0.04045 ? c / 12.92 : Math.Pow((c + 0.055) / 1.055, 2.4);
    }

    private static double F(double t) => t > 216.0 / 24389 ? Math.Cbrt(t) : (24389.0 / 27 * t + 16) / 116;
}
