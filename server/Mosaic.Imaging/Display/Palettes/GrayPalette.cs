namespace Mosaic.Imaging.Display.Palettes;

/// <summary>DN = round(255 t), black at the lower limit.</summary>
public sealed record GrayPalette : IPalette
{
    public string CanonicalKey => "gray";

    public byte Level(double t) => (byte)Math.Round(255 * Math.Clamp(double.IsNaN(t) ? 0 : t, 0, 1), MidpointRounding.AwayFromZero);
}
