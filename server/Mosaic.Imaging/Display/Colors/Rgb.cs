using System.Globalization;

namespace Mosaic.Imaging.Display.Colors;

/// <summary>An 8-bit sRGB colour.</summary>
public readonly record struct Rgb(byte R, byte G, byte B)
{
    /// <summary>Six lowercase hex digits, no '#': the form used in URLs and JSON.</summary>
    public string Hex => $"{R:x2}{G:x2}{B:x2}";

    /// <summary>Channels in [0, 1] rounded to the nearest 8-bit step; NaN counts as 0.</summary>
    public static Rgb FromUnit(double r, double g, double b) => new(Channel(r), Channel(g), Channel(b));

    /// <summary>Parses exactly six hex digits (either case, no '#'); ArgumentException naming <paramref name="parameter"/> otherwise.</summary>
    public static Rgb ParseHex(string text, string parameter = "color")
    {
        ArgumentNullException.ThrowIfNull(text, parameter);
        if (text.Length != 6 || !uint.TryParse(text, NumberStyles.AllowHexSpecifier, CultureInfo.InvariantCulture, out var value))
            throw new ArgumentException($"{parameter} must be six hex digits rrggbb (no '#'), not '{text}'", parameter);
        return new Rgb((byte)(value >> 16), (byte)(value >> 8), (byte)value);
    }

    public override string ToString() => Hex;

    private static byte Channel(double c) => (byte)Math.Round(255 * Math.Clamp(double.IsNaN(c) ? 0 : c, 0, 1), MidpointRounding.AwayFromZero);
}
