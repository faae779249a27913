using Mosaic.Imaging.Display.Colors;

namespace Mosaic.Imaging.Display;

/// <summary>How masked pixels (NaN or BLANK) are drawn: transparent, or one opaque colour. Never as a value.</summary>
public readonly record struct MaskedColor
{
    private MaskedColor(bool transparent, Rgb color)
    {
        IsTransparent = transparent;
        Color = color;
    }

    public static MaskedColor Transparent => new(true, default);

    public static MaskedColor Of(Rgb color) => new(false, color);

    /// <summary>True for a transparent mask; default(MaskedColor) is opaque black.</summary>
    public bool IsTransparent { get; }

    /// <summary>The colour; meaningful only when not transparent.</summary>
    public Rgb Color { get; }

    /// <summary>"transparent" or rrggbb (lowercase): the query-parameter form, also used in canonical keys.</summary>
    public string CanonicalKey => IsTransparent ? "transparent" : Color.Hex;

    /// <summary>Accepts "transparent" or six hex digits rrggbb; ArgumentException naming "masked" otherwise.</summary>
    public static MaskedColor Parse(string text)
    {
        ArgumentNullException.ThrowIfNull(text, "masked");
        if (text.Equals("transparent", StringComparison.OrdinalIgnoreCase)) return Transparent;
        if (text.Length != 6) throw new ArgumentException($"masked must be 'transparent' or six hex digits rrggbb (no '#'), not '{text}'", "masked");
        try
        {
            return Of(Rgb.ParseHex(text, "masked"));
        }
        catch (ArgumentException e)
        {
            throw new ArgumentException($"masked must be 'transparent' or six hex digits rrggbb (no '#'), not '{text}'", "masked", e);
        }
    }

    public override string ToString() => CanonicalKey;
}
