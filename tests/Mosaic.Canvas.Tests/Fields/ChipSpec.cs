namespace Mosaic.Canvas.Tests.Fields;

/// <summary>
/// A synthetic chip: its size, where its centre lies on the field's tangent plane (offsets in pixels of
/// <see cref="Scale"/> east and north of the field centre), its rotation and SIP terms, and its pixel values.
/// </summary>
internal sealed record ChipSpec(string Name, int Width, int Height, double East, double North, double RotationDegrees)
{
    /// <summary>Degrees per pixel.</summary>
    public double Scale { get; init; } = 1.5e-4;

    /// <summary>SIP A_p_q and B_p_q terms by name ("A_2_0" ...); none makes a plain TAN chip.</summary>
    public IReadOnlyDictionary<string, double> Sip { get; init; } = new Dictionary<string, double>();

    /// <summary>Value at 0-based (x, y); NaN for masked pixels.</summary>
    public Func<int, int, float> Values { get; init; } = (_, _) => 0f;

    /// <summary>The chip's WCS cards: TAN (or TAN-SIP) about its own centre pixel, which is CRPIX.</summary>
    public Dictionary<string, object> Cards(double fieldRa, double fieldDec)
    {
        var (ra, dec) = Gnomonic.Offset(fieldRa, fieldDec, East * Scale, North * Scale);
        double t = RotationDegrees * Math.PI / 180, s = Scale;
        var sip = Sip.Count > 0;
        var cards = new Dictionary<string, object>
        {
            ["CTYPE1"] = sip ? "RA---TAN-SIP" : "RA---TAN",
            ["CTYPE2"] = sip ? "DEC--TAN-SIP" : "DEC--TAN",
            ["CRPIX1"] = (Width + 1) / 2.0,
            ["CRPIX2"] = (Height + 1) / 2.0,
            ["CRVAL1"] = ra,
            ["CRVAL2"] = dec,
            // East left, north up, turned by the rotation.
            ["CD1_1"] = -s * Math.Cos(t),
            ["CD1_2"] = s * Math.Sin(t),
            ["CD2_1"] = s * Math.Sin(t),
            ["CD2_2"] = s * Math.Cos(t),
            ["RADESYS"] = "ICRS",
        };
        if (sip)
        {
            cards["A_ORDER"] = 3L;
            cards["B_ORDER"] = 3L;
            foreach (var (key, value) in Sip) cards[key] = value;
        }
        return cards;
    }

    /// <summary>Moderate SIP terms (about half a pixel at the corners of a 300 x 200 chip), scaled by <paramref name="k"/>.</summary>
    public static Dictionary<string, double> ModerateSip(double k) => new()
    {
        ["A_2_0"] = 2e-5 * k, ["A_0_2"] = -1.5e-5 * k, ["A_1_1"] = 1e-5 * k, ["A_3_0"] = 3e-8 * k, ["A_1_2"] = -2e-8 * k,
        ["B_2_0"] = -1e-5 * k, ["B_0_2"] = 2e-5 * k, ["B_1_1"] = 1.2e-5 * k, ["B_0_3"] = -2e-8 * k, ["B_2_1"] = 1.5e-8 * k,
    };
}
