using Mosaic.Fits;

namespace Mosaic.Benchmarks;

/// <summary>The TAN-SIP header of one chip of a synthetic benchmark field, placed by offsets from the field centre.</summary>
internal static class BenchmarkChipHeader
{
    /// <param name="side">Chip width and height in pixels.</param>
    /// <param name="scale">Degrees per pixel.</param>
    /// <param name="east">Offset of the chip centre east of the field centre, in pixels.</param>
    /// <param name="north">Offset north, in pixels.</param>
    /// <param name="turn">Rotation of the chip, degrees.</param>
    public static List<HeaderCard> Cards(int side, double scale, double east, double north, double turn)
    {
        const double ra0 = 150, dec0 = 2;
        // Small-offset tangent plane: exact enough to lay out a benchmark field.
        var dec = dec0 + north * scale;
        var ra = ra0 + east * scale / Math.Cos(dec0 * Math.PI / 180);
        double t = turn * Math.PI / 180;
        return
        [
            new("CTYPE1", "RA---TAN-SIP", null), new("CTYPE2", "DEC--TAN-SIP", null),
            new("CRPIX1", (side + 1) / 2.0, null), new("CRPIX2", (side + 1) / 2.0, null),
            new("CRVAL1", ra, null), new("CRVAL2", dec, null),
            new("CD1_1", -scale * Math.Cos(t), null), new("CD1_2", scale * Math.Sin(t), null),
            new("CD2_1", scale * Math.Sin(t), null), new("CD2_2", scale * Math.Cos(t), null),
            new("A_ORDER", 2L, null), new("B_ORDER", 2L, null),
            new("A_2_0", 1.5e-6, null), new("A_0_2", -1e-6, null), new("A_1_1", 5e-7, null),
            new("B_2_0", -8e-7, null), new("B_0_2", 1.2e-6, null), new("B_1_1", 6e-7, null),
        ];
    }
}
