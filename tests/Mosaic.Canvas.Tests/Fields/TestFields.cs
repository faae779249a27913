namespace Mosaic.Canvas.Tests.Fields;

/// <summary>The synthetic fields of the tests (an invented scenario: no real sky, camera or data).</summary>
internal static class TestFields
{
    public const double FieldRa = 187.3;
    public const double FieldDec = 31.6;

    /// <summary>
    /// Smooth values (slope at most about 3.3 per pixel) a thousand apart from chip to chip, so the owner of a pixel shows in its
    /// value; masked: a 10 x 6 block, one lone pixel and a 30-pixel run of a row.
    /// </summary>
    public static Func<int, int, float> Pattern(int k) => (x, y) =>
    {
        if ((x is >= 40 and < 50 && y is >= 30 and < 36) || (x == 100 && y == 77) || (y == 150 && x is >= 200 and < 230)) return float.NaN;
        return (float)(1000.0 * k + 50 + 20 * Math.Sin(x / 9.0 + k) * Math.Cos(y / 7.0) + 5 * Math.Sin((x + y) / 13.0));
    };

    /// <summary>
    /// Four 300 x 200 TAN-SIP chips in two rows, each turned a little: a 20-pixel gap between the lower two, a 15-pixel
    /// gap between the rows, and the upper two overlapping by about 20 pixels. <paramref name="sip"/> scales the distortion.
    /// </summary>
    public static SyntheticField GapsAndOverlap(double sip = 1) => new(FieldRa, FieldDec,
    [
        new ChipSpec("CCD-A", 300, 200, -160, -110, 0.4) { Sip = ChipSpec.ModerateSip(1 * sip), Values = Pattern(1) },
        new ChipSpec("CCD-B", 300, 200, 160, -110, -0.6) { Sip = ChipSpec.ModerateSip(-0.8 * sip), Values = Pattern(2) },
        new ChipSpec("CCD-C", 300, 200, -140, 105, 0.8) { Sip = ChipSpec.ModerateSip(0.6 * sip), Values = Pattern(3) },
        new ChipSpec("CCD-D", 300, 200, 140, 105, -0.3) { Sip = ChipSpec.ModerateSip(1.2 * sip), Values = Pattern(4) },
    ]);

    /// <summary>Two 256 x 256 TAN-SIP chips near RA 0; the first spans RA = 0.</summary>
    public static SyntheticField AcrossRaZero() => new(0.0, -12.0,
    [
        new ChipSpec("CCD-E", 256, 256, -60, 0, 0.5) { Sip = ChipSpec.ModerateSip(1), Values = Pattern(1) },
        new ChipSpec("CCD-F", 256, 256, 220, 10, -0.7) { Sip = ChipSpec.ModerateSip(-1), Values = Pattern(2) },
    ]);
}
